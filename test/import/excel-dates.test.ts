import { describe, expect, it } from 'vitest';
import reference from '../reference/import-reference.json';
import { isDateFormatCode, isoToSerial1900, serialToIso } from '../../src-shared/import/excel-dates';

describe('spreadsheet serial dates', () => {
  it('1900 system matches R as.Date(serial, origin = "1899-12-30") for serials from 61 (import-reference.json)', () => {
    reference.serial1900.serial.forEach((s, i) => {
      expect(serialToIso(s, false)).toBe(reference.serial1900.date[i]);
      expect(isoToSerial1900(reference.serial1900.date[i])).toBe(s);
    });
  });
  it('1904 system matches R as.Date(serial, origin = "1904-01-01") (import-reference.json)', () => {
    reference.serial1904.serial.forEach((s, i) => expect(serialToIso(s, true)).toBe(reference.serial1904.date[i]));
  });
  it('serials 1 to 60 count from 1900-01-01 with the fictitious 1900-02-29 (ECMA-376 Part 1, 18.17.4.1; common practice)', () => {
    expect(serialToIso(1, false)).toBe('1900-01-01');
    expect(serialToIso(59, false)).toBe('1900-02-28');
    expect(serialToIso(60, false)).toBe('1900-02-29');
    expect(serialToIso(61, false)).toBe('1900-03-01');
  });
  it('keeps the time of day and refuses impossible serials', () => {
    expect(serialToIso(43588.5, false)).toBe('2019-05-03T12:00');
    expect(serialToIso(-1, false)).toBeNull();
    expect(serialToIso(3e6, false)).toBeNull();
    expect(serialToIso(Number.NaN, false)).toBeNull();
  });
  it('tells date formats from number and duration formats (common practice)', () => {
    for (const f of ['dd/mm/yyyy', 'yyyy-mm-dd', 'd-mmm-yy', 'mmmm', '[$-409]d mmm yyyy;@', 'dd/mm/yyyy hh:mm']) expect(isDateFormatCode(f), f).toBe(true);
    for (const f of ['0', '0.00', '#,##0', 'hh:mm', '[h]:mm:ss', 'mm:ss', '"days" 0', '0.0"m"', '@']) expect(isDateFormatCode(f), f).toBe(false);
  });
});
