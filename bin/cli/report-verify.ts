/**
 * `tallywise report --verify`: the report set against the last entry of the
 * project's report history, as lines for stdout and an exit status (1 only
 * when the cleaned records and the models are the same as then and the
 * numbers are not).
 */
import { differenceLine, madeOn } from '@shared/report/since-last-section';
import type { SinceLast } from '@shared/report/since-last';

export function verifyOutcome(s: SinceLast | null): { lines: string[]; failed: boolean } {
  if (!s) return { lines: ['nothing to verify: the project has no earlier report in its history (the app records each report it makes; save the project after making one)'], failed: false };
  const then = `the report of ${madeOn(s.previous.madeAt)} (${s.previous.software.name} ${s.previous.software.version})`;
  switch (s.verdict) {
    case 'exact':
      return { lines: ['reproduced exactly', `  every number is the same as in ${then}`], failed: false };
    case 'rounding':
      return { lines: [`reproduced but for the last digits: the numbers agree with ${then} to one part in a billion, not bit for bit`], failed: false };
    case 'differs':
      return {
        lines: [`not reproduced: the cleaned records and the models are the same as in ${then}, yet ${s.differences.length === 1 ? 'one number differs' : `${s.differences.length} numbers differ`}:`, ...s.differences.map((d) => `  ${differenceLine(d)}`)],
        failed: true,
      };
    case 'models-changed':
      return { lines: [`not a full reproduction check: the cleaned records are the same as in ${then}, but:`, ...s.changes.map((c) => `  ${c}`), '  where the model did not change, the numbers are the same as then'], failed: false };
    case 'data-changed':
      return { lines: [`not a reproduction check: ${s.changes[0] ?? 'the cleaned records changed'} (since ${then}); the report's section "Since the last report" shows how the numbers moved`], failed: false };
  }
}
