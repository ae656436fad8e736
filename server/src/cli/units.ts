// The figures every face prints — checker text, JSON messages, SARIF, hovers, annotations,
// quick-fix titles, the HTML report and the C comments — come from here (the quantity
// formatting itself lives in shared-schema, where the spec layer's messages reach it too).
// Exact values stay exact; rounded ones carry "≈" in front, sign included ("≈+0.1 mHz").

import { decimalText, formatHz as formatUnsignedHz, formatSignedHz } from '../../../shared-schema/src/quantity-format';
import type { Rational } from '../../../shared-schema/src/rational';
import type { Plan } from '../planning/types';

export { compactHz, formatBytes, formatLsb, formatPpm, formatSeconds, formatSignedHz, significantText } from '../../../shared-schema/src/quantity-format';

/** Decimal text, exact when a short decimal holds the value, else rounded and marked "≈". */
export const exactOrRounded = (r: Rational): string => decimalText(r);

/** "3.997802734375 MHz"; with `signed`, an error with an explicit sign (see formatSignedHz). */
export const formatHz = (hz: Rational, signed = false): string => (signed ? formatSignedHz(hz) : formatUnsignedHz(hz));

/** The divider as written in the trade: "÷3", or "÷1+244/256" when it has a binary fraction. */
export function formatDivider(plan: Pick<Plan, 'dividerInteger' | 'dividerFraction' | 'fractionBits' | 'dividerStages'>): string {
  // A divider of counter stages shows their values, whose product is D: "÷3×25000".
  if (plan.dividerStages !== undefined && plan.dividerStages.length > 1) return `÷${plan.dividerStages.map((st) => st.value).join('×')}`;
  if (plan.dividerFraction === 0) return `÷${plan.dividerInteger}`;
  return `÷${plan.dividerInteger}+${plan.dividerFraction}/${2 ** plan.fractionBits}`;
}

/** Whole cycles M; a pinned plan may hold a fractional M, shown exactly or marked "≈". */
export const formatCycles = (cycles: Rational): string => decimalText(cycles);
