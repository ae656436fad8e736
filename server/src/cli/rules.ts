// The code catalogue as SARIF rule inputs: every code, in catalogue order, so rule indices are stable.

import { ALL_CODES, codeInfo } from '../spec/codes';
import type { RuleInfo } from './format-sarif';

export function catalogueRules(): RuleInfo[] {
  return ALL_CODES.map((code) => ({ code, ...codeInfo(code) }));
}
