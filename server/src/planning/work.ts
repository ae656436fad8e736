// The planning work of one output, counted in steps (walk steps, scanned lengths), never in
// seconds, so every result depends on its inputs only. Each output has an account; every search
// it runs (the nearest plan, the plan under S max, the fractional plan, whole-S walks) draws its
// steps from it, so one output's searches together stay within the account's limit. A file shares
// FILE_STEPS among its outputs (stepsPerOutput), so a file of many absurd outputs stays within
// seconds; a search that runs its account dry reports its plan as the best found (search-limit).

/** Steps one output may take when it is planned alone (about a second on an absurd domain). */
export const OUTPUT_STEPS = 1 << 21;
/** Steps the outputs of one file may take together (a few seconds). */
export const FILE_STEPS = 1 << 23;
/** No output gets fewer steps than this, however many the file holds. */
export const MIN_OUTPUT_STEPS = 1 << 14;

/**
 * Steps for each output of a file with `outputs` outputs: FILE_STEPS shared evenly over the next
 * power of two (so adding an output changes the share only when the count crosses one).
 */
export function stepsPerOutput(outputs: number): number {
  const bucket = 2 ** Math.ceil(Math.log2(Math.max(1, outputs)));
  return Math.max(MIN_OUTPUT_STEPS, Math.min(OUTPUT_STEPS, Math.floor(FILE_STEPS / bucket)));
}

/** The steps left to the output being planned, and what it has used. */
export class StepAccount {
  used = 0;
  /** Some search ran the account (or its own limit) dry. */
  limited = false;
  constructor(public left: number) {}
}

let current: StepAccount | null = null;

/** Runs `plan` with every search drawing from `account`. */
export function withAccount<T>(account: StepAccount, plan: () => T): T {
  const outer = current;
  current = account;
  try {
    return plan();
  } finally {
    current = outer;
  }
}

/**
 * Steps a search may still take, shared by its walk and the plain scans the walk falls back to:
 * at most its own limit and what the output's account has left (no account: its own limit).
 */
export class WorkBudget {
  private left: number;
  private readonly account: StepAccount | null;

  constructor(limit: number) {
    this.account = current;
    this.left = this.account === null ? limit : Math.min(limit, this.account.left);
  }

  /** Takes `steps` steps (default one); false once the budget is spent. */
  take(steps = 1): boolean {
    this.left -= steps;
    const a = this.account;
    if (a !== null) {
      a.left -= steps;
      a.used += steps;
      if (this.left < 0) a.limited = true;
    }
    return this.left >= 0;
  }

  get spent(): boolean {
    return this.left < 0;
  }

  /** Steps still to take. */
  get remaining(): number {
    return Math.max(0, this.left);
  }
}
