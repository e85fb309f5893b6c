import { describe, expect, it } from 'vitest';
import { looksLikeTextDate, parseTextDate, readDateColumn } from '../../src-shared/import/text-dates';

/** Date styles as written on field sheets (common practice); the ISO results are the calendar facts. */
describe('text dates', () => {
  it('reads each style', () => {
    expect(parseTextDate('2019-05-03', 'dmy')).toBe('2019-05-03');
    expect(parseTextDate('2019/5/3', 'mdy')).toBe('2019-05-03');
    expect(parseTextDate('03/05/2019', 'dmy')).toBe('2019-05-03');
    expect(parseTextDate('03/05/2019', 'mdy')).toBe('2019-03-05');
    expect(parseTextDate('3.5.2019', 'mdy')).toBe('2019-05-03'); // dotted is day first
    expect(parseTextDate('3 May 2019', 'mdy')).toBe('2019-05-03');
    expect(parseTextDate('May 3, 2019', 'dmy')).toBe('2019-05-03');
    expect(parseTextDate('3rd September 2019', 'dmy')).toBe('2019-09-03');
    expect(parseTextDate('7-May-19', 'dmy')).toBe('2019-05-07');
    expect(parseTextDate('03-05-98', 'dmy')).toBe('1998-05-03');
  });
  it('refuses impossible dates and non-dates', () => {
    expect(parseTextDate('31/02/2019', 'dmy')).toBeNull();
    expect(parseTextDate('29/02/2019', 'dmy')).toBeNull();
    expect(parseTextDate('29/02/2020', 'dmy')).toBe('2020-02-29');
    expect(parseTextDate('13/13/2019', 'dmy')).toBeNull();
    expect(looksLikeTextDate('Pond 3')).toBe(false);
    expect(looksLikeTextDate('3 Mayo 2019')).toBe(false);
  });
  it('settles the order from the column, asks when nothing settles it, flags a mix', () => {
    expect(readDateColumn(['01/05/2019', '20/05/2019']).order).toBe('dmy');
    expect(readDateColumn(['05/01/2019', '05/20/2019']).order).toBe('mdy');
    const amb = readDateColumn(['01/05/2019', '02/06/2019', '', '2019-05-03']);
    expect(amb.order).toBe('ambiguous');
    expect(amb.examples).toEqual(['01/05/2019', '02/06/2019']);
    expect(amb.nonBlank).toBe(3);
    expect(readDateColumn(['20/05/2019', '05/20/2019']).order).toBe('mixed');
    expect(readDateColumn(['2019-05-03', '3 May 2019']).order).toBe('none');
    expect(readDateColumn(['05/05/2019']).order).toBe('dmy'); // same day either way
  });
});
