import { describe, expect, it } from 'vitest';
import reference from '../reference/import-reference.json';
import { jaroWinkler, levenshtein, looksLikeVariant, variantGroups } from '../../src-shared/import/similarity';

describe('name similarity', () => {
  it('Levenshtein distance matches R utils::adist (import-reference.json)', () => {
    const { a, b, distance } = reference.levenshtein;
    a.forEach((x, i) => expect(levenshtein(x, b[i]), `${x} / ${b[i]}`).toBe(distance[i]));
  });
  it('Jaro-Winkler matches the worked examples of Winkler (1990) as usually quoted (from memory)', () => {
    expect(jaroWinkler('martha', 'marhta')).toBeCloseTo(0.961, 3);
    expect(jaroWinkler('dwayne', 'duane')).toBeCloseTo(0.84, 3);
    expect(jaroWinkler('dixon', 'dicksonx')).toBeCloseTo(0.813, 3);
    expect(jaroWinkler('same', 'same')).toBe(1);
    expect(jaroWinkler('abc', 'xyz')).toBe(0);
  });
  it('takes case, space and one-letter slips for variants, but not different numbers', () => {
    expect(looksLikeVariant('Lapwing Hollow Pond', 'Lapwing Hollow pond ')).toBe(true);
    expect(looksLikeVariant('Millrace Pool', 'Milrace Pool')).toBe(true);
    expect(looksLikeVariant('Pond 12', 'Pond 13')).toBe(false);
    expect(looksLikeVariant('Upper Marl Pit', 'Lower Marl Pit')).toBe(false);
    expect(looksLikeVariant('Common toad', 'Common frog')).toBe(false);
  });
  it('suggests merging into the more frequent spelling', () => {
    const groups = variantGroups(new Map([['Millrace Pool', 9], ['Milrace Pool', 1], ['Rushmoor Pond', 8]]));
    expect(groups).toEqual([{ keep: 'Millrace Pool', keepCount: 9, variants: [{ name: 'Milrace Pool', count: 1 }] }]);
  });
});
