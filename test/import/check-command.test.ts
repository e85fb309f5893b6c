import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { check } from '../../bin/cli/commands/check';

/** Exit status and output of `tallywise check` per shared/cli-contract.md: 0 clean, 1 findings need action, 2 bad usage or unreadable input. */
let dir: string;
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'tw-cli-check-'));
  await writeFile(join(dir, 'clean.csv'), 'Site,Date,Count,Minutes\nNorth,2019-05-03,4,30\nNorth,2019-05-20,2,30\nSouth,2019-05-04,0,25\nSouth,2019-05-21,1,25\n');
  await writeFile(join(dir, 'bad.csv'), 'Site,Date,Count,Minutes\nNorth,2019-05-03,4,30\nNorth,2019-05-20,-2,30\nSouth,2019-05-04,0,\nSouth,2019-05-21,1,25\n');
  await writeFile(join(dir, 'dates.csv'), 'Site,Date,Count\nNorth,03/05/2019,4\nNorth,04/06/2019,2\n');
  await writeFile(join(dir, 'broken.xlsx'), 'not a zip');
  await writeFile(join(dir, 'bad-template.json'), '{"kind":"tallywise-mapping"');
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

async function run(...args: string[]) {
  const out: string[] = [];
  const err: string[] = [];
  const code = await check.run(args, { out: (t) => out.push(t), err: (t) => err.push(t) });
  return { code, out: out.join('\n'), err: err.join('\n') };
}

describe('check command', () => {
  it('exits 0 on clean data', async () => {
    const r = await run(join(dir, 'clean.csv'));
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/4 rows, 4 count records, 2 sites/);
    expect(r.out).toMatch(/0 errors, 0 warnings/);
  });
  it('exits 1 and names row, column and fix for each finding', async () => {
    const r = await run(join(dir, 'bad.csv'));
    expect(r.code).toBe(1);
    expect(r.out).toMatch(/bad\.csv, row 3, column C \("Count"\): The count is negative \(-2\)\. \[negative-count\]\n {2}fix: /);
    expect(r.out).toMatch(/row 4, column D \("Minutes"\): A count was made but the effort is missing/);
  });
  it('prints JSON with --json', async () => {
    const r = await run(join(dir, 'bad.csv'), '--json');
    expect(r.code).toBe(1);
    const j = JSON.parse(r.out);
    expect(j.status).toBe('needs-action');
    expect(j.findings.map((f: { code: string }) => f.code)).toEqual(expect.arrayContaining(['negative-count', 'effort-missing']));
    expect(j.encoding).toBe('utf-8');
  });
  it('asks the date-order question (exit 1) and takes the answer', async () => {
    const open = await run(join(dir, 'dates.csv'));
    expect(open.code).toBe(1);
    expect(open.out).toMatch(/question: column B \("Date"\).*\n {2}fix: run again with --date-order dmy or --date-order mdy/);
    const answered = await run(join(dir, 'dates.csv'), '--date-order', 'dmy');
    expect(answered.out).not.toMatch(/question/);
  });
  it('exits 2 on an unreadable file or template, with a plain message and no stack trace', async () => {
    for (const r of [await run(join(dir, 'broken.xlsx')), await run(join(dir, 'clean.csv'), '--template', join(dir, 'bad-template.json')), await run(join(dir, 'missing.csv'))]) {
      expect(r.code).toBe(2);
      expect(r.err.length).toBeGreaterThan(20);
      expect(r.err).not.toMatch(/\n\s+at /);
      expect(r.out).toBe('');
    }
  });
  it('exits 2 on bad usage', async () => {
    expect((await run()).code).toBe(2);
    expect((await run('a.csv', '--colour')).err).toMatch(/Unknown option --colour/);
    expect((await run('a.csv', '--date-order', 'ymd')).err).toMatch(/dmy or mdy/);
  });
});
