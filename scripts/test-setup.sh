#!/usr/bin/env bash
# Makes sure the system has what the test tiers need before any of them runs, so a missing tool
# fails at once and by name rather than minutes into the run.
#   bash scripts/test-setup.sh unit   gcc and g++ (the exported C is compiled), Chromium (the HTML
#                                     report is rendered): the vitest tiers
#   bash scripts/test-setup.sh e2e    Chromium and what the browser-hosted editor builds against
#   bash scripts/test-setup.sh        both
# As root it installs what is missing with apt-get; otherwise it prints the exact command to run
# and exits 1. Nothing is installed when everything is there (about 0.1 s).
set -euo pipefail

tier="${1:-all}"
UNIT=(gcc g++ chromium)
# The editor's install builds native modules: a compiler, make, python3 and pkg-config, plus the
# headers of the libraries they bind (Kerberos, X keyboard files, the secret store, X11).
E2E=(chromium g++ make python3 pkg-config libkrb5-dev libxkbfile-dev libsecret-1-dev libx11-dev)
case "$tier" in
  unit) wanted=("${UNIT[@]}") ;;
  e2e) wanted=("${E2E[@]}") ;;
  all) wanted=("${UNIT[@]}" "${E2E[@]}") ;;
  *) echo "usage: bash scripts/test-setup.sh [unit|e2e|all]" >&2; exit 2 ;;
esac

log() { printf 'test-setup: %s\n' "$*"; }

if ! command -v dpkg-query >/dev/null; then
  # Not a Debian-like system: check the tools themselves and name what is missing.
  lacking=()
  for tool in gcc g++; do command -v "$tool" >/dev/null || lacking+=("$tool"); done
  [[ -x /usr/bin/chromium ]] || lacking+=("Chromium at /usr/bin/chromium")
  if ((${#lacking[@]})); then
    log "missing: ${lacking[*]}. Install them with your system's package manager, then run the tests again."
    exit 1
  fi
  exit 0
fi

missing=()
for p in $(printf '%s\n' "${wanted[@]}" | sort -u); do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q 'install ok installed' || missing+=("$p")
done
((${#missing[@]})) || exit 0

command_line="apt-get update && apt-get install -y --no-install-recommends ${missing[*]}"
if [[ $(id -u) -ne 0 ]]; then
  log "the tests need Debian packages that are not installed: ${missing[*]}"
  log "install them as root, then run the tests again:"
  log "  sudo sh -c '$command_line'"
  exit 1
fi
log "installing ${missing[*]}"
export DEBIAN_FRONTEND=noninteractive
# Others may hold the dpkg lock (unattended upgrades, a parallel setup): wait for it, do not fail.
apt-get -o DPkg::Lock::Timeout=600 update -qq
apt-get -o DPkg::Lock::Timeout=600 install -y -qq --no-install-recommends "${missing[@]}" >/dev/null
[[ -x /usr/bin/chromium ]] || { log "/usr/bin/chromium not found after installing chromium"; exit 1; }
