import { describe, expect, it } from 'vitest';
import { main } from '../../bin/cli/main';
import type { CliIO } from '../../bin/cli/command';
import { parseArgs } from '../../bin/cli/args';

function collect(): CliIO & { stdout: string[]; stderr: string[] } {
  const stdout: string[] = [];
  const stderr: string[] = [];
  return { stdout, stderr, out: (t) => stdout.push(t), err: (t) => stderr.push(t) };
}

// Exit statuses and error style are fixed by the command-line contract:
// 0 success, 1 problems to act on, 2 bad usage or unreadable input, no stack traces.
describe('tallywise command line', () => {
  it('help lists every command with a summary and exits 0', async () => {
    const io = collect();
    expect(await main(['help'], io)).toBe(0);
    const text = io.stdout.join('\n');
    for (const name of ['check', 'fit', 'merge', 'demo']) expect(text).toMatch(new RegExp(`^  ${name}\\s+\\S`, 'm'));
    expect(io.stderr).toEqual([]);
  });

  it('help for one command shows its usage', async () => {
    const io = collect();
    expect(await main(['help', 'fit'], io)).toBe(0);
    expect(io.stdout.join('\n')).toMatch(/--data/);
  });

  it('an unknown command is a usage error (2) naming it', async () => {
    const io = collect();
    expect(await main(['fitt'], io)).toBe(2);
    expect(io.stderr.join('\n')).toMatch(/no command "fitt"/);
  });

  it('an unknown option is a usage error naming the option and the ones there are', async () => {
    const io = collect();
    expect(await main(['demo', '--outt', 'x'], io)).toBe(2);
    const err = io.stderr.join('\n');
    expect(err).toMatch(/--outt/);
    expect(err).toMatch(/--out\b/);
    expect(err).not.toMatch(/at .*\.ts:\d+/);
  });

  it('a missing required option says which one', async () => {
    const io = collect();
    expect(await main(['fit', '--spec', 'x.json'], io)).toBe(2);
    expect(io.stderr.join('\n')).toMatch(/--data/);
  });

  it('an unreadable spec file is exit 2 with the path, never a stack trace', async () => {
    const io = collect();
    expect(await main(['fit', '--data', '/nonexistent/a.csv', '--spec', '/nonexistent/spec.json'], io)).toBe(2);
    const err = io.stderr.join('\n');
    expect(err).toMatch(/\/nonexistent\/spec\.json/);
    expect(err).not.toMatch(/\n\s+at /);
  });
});

describe('argument parsing', () => {
  it('takes --name value, --name=value, switches and positionals', () => {
    const a = parseArgs(['x.xlsx', '--out', 'dir', '--seed=4', '--json'], { values: ['out', 'seed'], flags: ['json'] });
    expect(a.positional).toEqual(['x.xlsx']);
    expect(a.options.get('out')).toBe('dir');
    expect(a.options.get('seed')).toBe('4');
    expect(a.flags.has('json')).toBe(true);
  });
  it('refuses an option without its value', () => {
    expect(() => parseArgs(['--out'], { values: ['out'] })).toThrow(/--out needs a value/);
    expect(() => parseArgs(['--out', '--json'], { values: ['out'], flags: ['json'] })).toThrow(/--out needs a value/);
  });
});

describe('fit on bad data', () => {
  it('names the data row and its row in the file, exit 2', async () => {
    const { mkdtempSync, writeFileSync } = await import('node:fs');
    const { tmpdir } = await import('node:os');
    const { join } = await import('node:path');
    const dir = mkdtempSync(join(tmpdir(), 'tw-cli-'));
    writeFileSync(join(dir, 'bad.csv'), 'count,x\n1,0.1\n-2,0.2\n3,0.3\n');
    writeFileSync(join(dir, 'spec.json'), JSON.stringify({ response: 'count', distribution: 'poisson', predictors: [{ column: 'x', type: 'numeric' }] }));
    const io = collect();
    expect(await main(['fit', '--data', join(dir, 'bad.csv'), '--spec', join(dir, 'spec.json')], io)).toBe(2);
    const err = io.stderr.join('\n');
    expect(err).toMatch(/data row 2\b/);
    expect(err).toMatch(/is row 3, counting the header row/);
    expect(err).not.toMatch(/Usage:/);
  });
});
