/**
 * Ctrl-C on the built command line: a long `tallywise power` run, sent
 * SIGINT as a terminal does once it is under way, stops its worker threads,
 * prints nothing on standard output, says so on standard error and exits 130
 * (128 + SIGINT: common practice for shells). Needs `npm run build` (npm
 * test does it).
 */
import { spawn } from 'node:child_process';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const bin = join(__dirname, '..', '..', 'bin', 'tallywise');

describe('the command line under Ctrl-C', () => {
  it('stops a power simulation at once and exits 130 with nothing half-printed', async () => {
    const child = spawn(process.execPath, [bin, 'power', '--replicates', '20000', '--jobs', '2'], { stdio: ['ignore', 'pipe', 'pipe'] });
    let out = '';
    let err = '';
    let sentAt = 0;
    child.stdout.on('data', (d) => (out += d));
    child.stderr.on('data', (d) => {
      err += d;
      // The first progress line: the simulation is under way.
      if (!sentAt && / of \d+ programmes/.test(err)) {
        sentAt = Date.now();
        child.kill('SIGINT');
      }
    });
    const { code, signal } = await new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((res) => child.on('exit', (code, signal) => res({ code, signal })));
    expect({ code, signal, err }).toMatchObject({ code: 130, signal: null });
    expect(err).toContain('Stopped: the simulation was interrupted; nothing was printed.');
    expect(out).toBe('');
    // 20 000 replicates take minutes; stopping must not wait for them.
    expect(Date.now() - sentAt).toBeLessThan(20_000);
  }, 180_000);
});
