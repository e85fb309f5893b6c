import { z } from 'zod';
import { CellKind } from './cells';
import { parseNumber } from '../data/table';

/**
 * Field codes: what a count cell's text means. An editable table of rules,
 * tried in order; the first that matches gives the status and (from the
 * pattern's first matching group) the number. A cell that is already a number is
 * `counted`. Defaults follow common practice on tally sheets.
 */
export const countStatuses = ['counted', 'not-surveyed', 'present', 'at-least', 'approximate', 'invalid'] as const;
export type CountStatus = (typeof countStatuses)[number];
export const StatusCode: Record<CountStatus, number> = { counted: 0, 'not-surveyed': 1, present: 2, 'at-least': 3, approximate: 4, invalid: 5 };

export const fieldCodeRuleSchema = z.object({
  id: z.string().min(1),
  status: z.enum(countStatuses),
  /** Exact texts, compared with case and surrounding spaces ignored. */
  texts: z.array(z.string()).optional(),
  /** A regular expression over the trimmed text (case ignored); the first capturing group that matched holds the number. */
  pattern: z.string().optional(),
  /** For texts: the number they stand for (e.g. "-" as 0). */
  number: z.number().optional(),
  note: z.string().optional(),
});
export type FieldCodeRule = z.infer<typeof fieldCodeRuleSchema>;

const num = String.raw`(\d+(?:[.,]\d+)?)`;

export const defaultFieldCodes: readonly FieldCodeRule[] = [
  { id: 'blank', status: 'not-surveyed', texts: [''], note: 'A blank count cell is read as not surveyed, never as zero.' },
  { id: 'not-surveyed', status: 'not-surveyed', texts: ['ns', 'n/s', 'n.s.', 'not surveyed', 'not counted', 'nc', 'n/c', 'no visit', 'na', 'n/a'] },
  { id: 'present', status: 'present', texts: ['x', 'p', 'present', 'pres', 'seen', '+', 'y', 'yes'] },
  { id: 'dash-zero', status: 'counted', texts: ['-', '–', '—', 'nil', 'none'], number: 0, note: 'A dash is read as none seen; make it not-surveyed if your sheets use it that way.' },
  { id: 'unknown', status: 'invalid', texts: ['?', '??', 'unknown', 'unk'] },
  { id: 'at-least', status: 'at-least', pattern: String.raw`^(?:>|>=|≥|at least\s*|min\.?\s*)\s*${num}$|^${num}\s*\+$` },
  { id: 'approximate', status: 'approximate', pattern: String.raw`^(?:~|≈|c\.|ca\.?|circa|approx\.?|about)\s*${num}$|^${num}\s*\?$` },
];

export interface CountReading {
  readonly status: CountStatus;
  /** The number counted (or the bound, or the estimate); NaN when there is none. */
  readonly number: number;
  /** The rule that matched, or '' for a plain number; 'no-rule' when nothing matched (status invalid). */
  readonly rule: string;
}

export type CountClassifier = (text: string, kind: number, number: number) => CountReading;

/** Builds a classifier from a rule table; readings are cached per distinct text. */
export function compileFieldCodes(rules: readonly FieldCodeRule[] = defaultFieldCodes, decimalMark: '.' | ',' = '.'): CountClassifier {
  const exact = new Map<string, FieldCodeRule>();
  const patterns: { rule: FieldCodeRule; re: RegExp }[] = [];
  for (const rule of rules) {
    for (const t of rule.texts ?? []) {
      const key = t.trim().toLowerCase();
      if (!exact.has(key)) exact.set(key, rule);
    }
    if (rule.pattern) patterns.push({ rule, re: new RegExp(rule.pattern, 'iu') });
  }
  const cache = new Map<string, CountReading>();
  const counted = (n: number): CountReading => ({ status: 'counted', number: n, rule: '' });
  return (text, kind, number) => {
    if (kind === CellKind.number) return counted(number);
    if (kind === CellKind.error) return { status: 'invalid', number: Number.NaN, rule: 'formula-error' };
    const hit = cache.get(text);
    if (hit) return hit;
    let reading: CountReading;
    const key = text.trim().toLowerCase();
    const rule = exact.get(key);
    const asNumber = parseNumber(key, decimalMark);
    if (rule) reading = { status: rule.status, number: rule.number ?? Number.NaN, rule: rule.id };
    else if (!Number.isNaN(asNumber)) reading = counted(asNumber);
    else {
      reading = { status: 'invalid', number: Number.NaN, rule: 'no-rule' };
      for (const { rule: r, re } of patterns) {
        const m = re.exec(text.trim());
        if (!m) continue;
        const n = m.slice(1).find((g) => g !== undefined);
        reading = { status: r.status, number: n === undefined ? (r.number ?? Number.NaN) : Number(n.replace(',', '.')), rule: r.id };
        break;
      }
    }
    if (cache.size < 10_000) cache.set(text, reading);
    return reading;
  };
}

export interface ClassifiedColumn {
  /** StatusCode per cell. */
  readonly status: Uint8Array;
  readonly numbers: Float64Array;
  /** Per cell, the rule id (shared strings; '' for plain numbers). */
  readonly rules: readonly string[];
}

/** Classifies every cell of a column. */
export function classifyColumn(col: { texts: readonly string[]; kinds: Uint8Array; numbers: Float64Array }, classify: CountClassifier): ClassifiedColumn {
  const n = col.texts.length;
  const status = new Uint8Array(n);
  const numbers = new Float64Array(n);
  const rules = new Array<string>(n);
  for (let i = 0; i < n; i++) {
    const r = classify(col.texts[i], col.kinds[i], col.numbers[i]);
    status[i] = StatusCode[r.status];
    numbers[i] = r.number;
    rules[i] = r.rule;
  }
  return { status, numbers, rules };
}
