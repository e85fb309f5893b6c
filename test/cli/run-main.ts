import { main } from '../../bin/cli/main';

/** Runs one `tallywise` command line through main() in this process, collecting what it prints. */
export async function runCli(...argv: string[]): Promise<{ status: number; out: string; err: string }> {
  const out: string[] = [];
  const err: string[] = [];
  const status = await main(argv, { out: (t) => out.push(t), err: (t) => err.push(t) });
  return { status, out: out.join('\n'), err: err.join('\n') };
}
