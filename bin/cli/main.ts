import type { CliCommand, CliIO } from './command';
import { UsageError } from './command';
import { commands } from './commands/index';

const stdio: CliIO = {
  out: (t) => process.stdout.write(t.endsWith('\n') ? t : `${t}\n`),
  err: (t) => process.stderr.write(t.endsWith('\n') ? t : `${t}\n`),
};

export function helpText(list: readonly CliCommand[]): string {
  const width = Math.max(...list.map((c) => c.name.length));
  const lines = list.map((c) => `  ${c.name.padEnd(width)}  ${c.summary}`);
  return [
    'Tallywise: count-data workbench for monitoring programmes (command line).',
    '',
    'Usage: tallywise <command> [options]',
    '',
    'Commands:',
    ...lines,
    '',
    'Run `tallywise help <command>` for a command\'s options. Add --debug to any command to see internal detail on failure.',
  ].join('\n');
}

/** Runs one command line; returns the exit status (shared/cli-contract.md). */
export async function main(argv: string[], io: CliIO = stdio): Promise<number> {
  const [name, ...rest] = argv;
  const debug = rest.includes('--debug');
  if (!name || name === 'help' || name === '--help' || name === '-h') {
    const topic = rest.find((a) => !a.startsWith('--'));
    if (topic) {
      const c = commands.find((x) => x.name === topic);
      if (!c) {
        io.err(`There is no command "${topic}". Run \`tallywise help\` for the list.`);
        return 2;
      }
      io.out(`${c.summary}\n\n${c.usage}`);
      return 0;
    }
    io.out(helpText(commands));
    return 0;
  }
  const command = commands.find((c) => c.name === name);
  if (!command) {
    io.err(`There is no command "${name}". Run \`tallywise help\` for the list.`);
    return 2;
  }
  try {
    return await command.run(rest, io);
  } catch (err) {
    if (err instanceof UsageError) {
      io.err(err.message);
      if (err.status === 2) io.err(`Usage:\n${command.usage}`);
      return err.status;
    }
    const e = err as Error;
    io.err(e?.message ? e.message : String(err));
    if (debug && e?.stack) io.err(e.stack);
    return 2;
  }
}
