import { beforeAll, describe, expect, it } from 'vitest';
import { exportMethods } from '../../src-renderer/src/worker/export-methods';
import { demoExport, type DemoExport } from './demo-export';

// The page's export worker method, called directly in Node: from the
// sources, the change log and the site list it replays the cleaning and
// builds the same tables the shared builder gives for the cleaned analysis,
// reporting a stage per table. Demo data: invented, simulated.

let d: DemoExport;
beforeAll(async () => {
  d = await demoExport();
}, 120_000);

describe('export worker method', () => {
  it('gives the builder\'s tables, with its stages in order', async () => {
    const stages: [number, string][] = [];
    const got = await exportMethods.export([{ sources: d.sources, log: d.log, siteSheet: d.siteSheet, origin: d.origin }], { onProgress: (f, s) => stages.push([f, s]), signal: { aborted: false } });
    expect(got).toEqual(d.exported);
    expect(stages.map((s) => s[1])).toEqual(['replaying the cleaning', 'the records table', 'the analysis table', 'the change log']);
    const fractions = stages.map((s) => s[0]);
    expect(fractions).toEqual([...fractions].sort((a, b) => a - b));
    expect(fractions.every((f) => f >= 0 && f <= 1)).toBe(true);
  });
});
