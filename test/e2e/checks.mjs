// A minimal check runner: named checks in order, each passes or fails with a reason; a check whose
// prerequisite failed fails too (never skipped), so the closing count always covers every check.

export class Checks {
  results = [];
  /** Called with the check's name and index after a failure (the suite takes a screenshot). */
  onFail = undefined;

  /** Runs `body`; `needs` names checks that must have passed first. */
  async run(name, body, { needs = [] } = {}) {
    const started = Date.now();
    const missing = needs.filter((n) => !this.results.some((r) => r.name === n && r.ok));
    let ok = false;
    let detail = '';
    if (missing.length > 0) {
      detail = `not reached: needs ${missing.join(', ')}`;
    } else {
      try {
        detail = (await body()) ?? '';
        ok = true;
      } catch (error) {
        detail = error instanceof Error ? error.message.split('\n')[0] : String(error);
        try {
          await this.onFail?.(name, this.results.length + 1);
        } catch {
          // a failed screenshot must not hide the failure it was meant to show
        }
      }
    }
    const ms = Date.now() - started;
    this.results.push({ name, ok, detail, ms });
    console.log(`${ok ? 'PASS' : 'FAIL'}  ${name} (${ms} ms)${detail ? ` — ${detail}` : ''}`);
    return ok;
  }

  get passed() {
    return this.results.filter((r) => r.ok).length;
  }

  get failed() {
    return this.results.length - this.passed;
  }
}

/** Throws with `message` when `condition` is false; the message says what was expected and seen. */
export function expect(condition, message) {
  if (!condition) throw new Error(message);
}
