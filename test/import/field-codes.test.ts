import { describe, expect, it } from 'vitest';
import { CellKind } from '../../src-shared/import/cells';
import { classifyColumn, compileFieldCodes, defaultFieldCodes, fieldCodeRuleSchema, StatusCode } from '../../src-shared/import/field-codes';

/** The default codes are those common on tally sheets (common practice). */
describe('field codes', () => {
  const classify = compileFieldCodes();
  const text = (t: string) => classify(t, t.trim() === '' ? CellKind.blank : CellKind.text, Number.NaN);

  it('reads the common codes with their status and number', () => {
    const cases: [string, string, number | null][] = [
      ['', 'not-surveyed', null], ['NS', 'not-surveyed', null], ['n/s', 'not-surveyed', null], ['Not surveyed', 'not-surveyed', null],
      ['x', 'present', null], ['X', 'present', null], ['P', 'present', null], ['present', 'present', null],
      ['-', 'counted', 0], ['?', 'invalid', null], ['0', 'counted', 0], ['12', 'counted', 12], [' 7 ', 'counted', 7],
      ['>50', 'at-least', 50], ['> 50', 'at-least', 50], ['50+', 'at-least', 50], ['≥20', 'at-least', 20],
      ['~20', 'approximate', 20], ['c. 20', 'approximate', 20], ['ca 20', 'approximate', 20], ['ca. 15', 'approximate', 15], ['circa 8', 'approximate', 8],
      ['lots', 'invalid', null], ['12 adults', 'invalid', null],
    ];
    for (const [t, status, n] of cases) {
      const r = text(t);
      expect(r.status, JSON.stringify(t)).toBe(status);
      if (n === null) expect(Number.isNaN(r.number), JSON.stringify(t)).toBe(true);
      else expect(r.number, JSON.stringify(t)).toBe(n);
    }
  });
  it('takes number cells as counted and formula errors as invalid', () => {
    expect(classify('3', CellKind.number, 3)).toEqual({ status: 'counted', number: 3, rule: '' });
    expect(classify('#N/A', CellKind.error, Number.NaN).status).toBe('invalid');
  });
  it('follows an edited rule table (first match wins; a decimal comma when asked)', () => {
    const rules = [{ id: 'blank-zero', status: 'counted' as const, texts: [''], number: 0 }, { id: 'dash', status: 'not-surveyed' as const, texts: ['-'] }, ...defaultFieldCodes];
    const c = compileFieldCodes(rules, ',');
    expect(c('', CellKind.blank, Number.NaN)).toMatchObject({ status: 'counted', number: 0, rule: 'blank-zero' });
    expect(c('-', CellKind.text, Number.NaN).status).toBe('not-surveyed');
    expect(c('2,5', CellKind.text, Number.NaN)).toMatchObject({ status: 'counted', number: 2.5 });
    expect(c('~2,5', CellKind.text, Number.NaN)).toMatchObject({ status: 'approximate', number: 2.5 });
    expect(fieldCodeRuleSchema.array().parse(JSON.parse(JSON.stringify(rules)))).toEqual(rules);
  });
  it('classifies a column into status codes and numbers', () => {
    const col = { texts: ['4', 'NS', '>50', 'x'], kinds: Uint8Array.from([CellKind.number, CellKind.text, CellKind.text, CellKind.text]), numbers: Float64Array.from([4, NaN, NaN, NaN]) };
    const out = classifyColumn(col, classify);
    expect(Array.from(out.status)).toEqual([StatusCode.counted, StatusCode['not-surveyed'], StatusCode['at-least'], StatusCode.present]);
    expect(out.numbers[0]).toBe(4);
    expect(out.numbers[2]).toBe(50);
    expect(out.rules).toEqual(['', 'not-surveyed', 'at-least', 'present']);
  });
});
