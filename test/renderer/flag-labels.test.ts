import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { flagLabel } from '@shared/cleaning/finding-flags';
import { pageCodes } from '../../src-main/services/record-checks';

// Every record-level finding code the shared validation can emit reaches the
// grid as a chip; each must have wording of its own rather than the raw code.
describe('grid chips for findings', () => {
  it('label every record-level code of the shared validation', () => {
    const text = readFileSync(resolve(__dirname, '../../src-shared/import/validate.ts'), 'utf8');
    const codes = [...new Set([...text.matchAll(/code: '([a-z-]+)'/g)].map((m) => m[1]))];
    expect(codes.length).toBeGreaterThan(10);
    const unlabelled = codes.map((c) => pageCodes[c] ?? c).filter((c) => flagLabel(c) === c);
    expect(unlabelled).toEqual([]);
  });
});
