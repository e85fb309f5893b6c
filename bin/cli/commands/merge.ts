import { readFile } from 'node:fs/promises';
import { basename, resolve } from 'node:path';
import { levelsOf, sortLevels } from '@shared/data/table';
import { needsAttention, parseGroupLine, type GroupLine } from '@shared/worker/group-lines';
import { loadDataTable } from '../../../src-main/data/load-table';
import { parseArgs } from '../args';
import { UsageError, type CliCommand, type CliIO } from '../command';

export const merge: CliCommand = {
  name: 'merge',
  summary: 'Join the outputs of `fit --by --shard` runs into one, sorted by group.',
  usage: [
    '  tallywise merge FILE... [--expect LIST | --data FILE --by COLUMN [--sheet NAME]]',
    '',
    '  FILE     outputs of `tallywise fit --by COLUMN --shard I/N` (JSON lines, one group a line)',
    '  --expect a text file with every group that must be there, one a line',
    '  --data, --by, --sheet',
    '           the table and column the shards were run on: every group of the column must be there',
    '',
    '  Prints the lines of every file, one group a line, in the sorted order of the groups',
    '  (numeric order when all are numbers, else by code point). Refuses, printing nothing, when a',
    '  group appears twice, and, with --expect or --data, when an expected group is missing or an',
    '  unexpected one is there.',
    '  Exit status 1 when a merged group did not converge or could not be fitted; 2 when refused.',
  ].join('\n'),
  async run(argv, io) {
    try {
      return await mergeFiles(argv, io);
    } catch (err) {
      if (!(err instanceof MergeRefused)) throw err;
      io.err(err.message);
      return 2;
    }
  },
};

/** Input that merge will not join (bad line, duplicate, missing group): said plainly, without the usage text. */
class MergeRefused extends Error {}

async function mergeFiles(argv: string[], io: CliIO): Promise<number> {
  const args = parseArgs(argv, { values: ['expect', 'data', 'by', 'sheet'] });
  if (args.positional.length === 0) throw new UsageError('Give the shard output files to merge.');
  const expected = await expectedGroups(args.options);
  const seen = new Map<string, { where: string; text: string; line: GroupLine }>();
  for (const file of args.positional) {
    const path = resolve(file);
    let text: string;
    try {
      text = await readFile(path, 'utf8');
    } catch {
      throw new MergeRefused(`Cannot read ${path}. Check the path.`);
    }
    const lines = text.replace(/^\uFEFF/, '').split(/\r?\n/);
    lines.forEach((raw, i) => {
      const t = raw.trim();
      if (t === '') return;
      const where = `${basename(path)} line ${i + 1}`;
      let line: GroupLine;
      try {
        line = parseGroupLine(t, where);
      } catch (err) {
        throw new MergeRefused((err as Error).message);
      }
      const before = seen.get(line.group);
      if (before) {
        throw new MergeRefused(`Group "${line.group}" is in ${before.where} and again in ${where}. Each group must come from one shard: merge the outputs of one set of shards (same N), or remove the extra line.`);
      }
      seen.set(line.group, { where, text: t, line });
    });
  }
  if (expected) checkExpected(expected.groups, expected.from, [...seen.keys()]);
  const order = sortLevels([...seen.keys()]);
  const attention: string[] = [];
  for (const g of order) {
    const entry = seen.get(g)!;
    io.out(entry.text);
    if (needsAttention(entry.line)) attention.push(g);
  }
  io.err(`Merged ${order.length} group${order.length === 1 ? '' : 's'} from ${args.positional.length} file${args.positional.length === 1 ? '' : 's'}.`);
  if (attention.length) io.err(`${attention.length} did not converge or could not be fitted: ${listed(attention)}.`);
  return attention.length ? 1 : 0;
}

function listed(groups: readonly string[], max = 10): string {
  const shown = groups.slice(0, max).map((g) => `"${g}"`);
  return groups.length > max ? `${shown.join(', ')} and ${groups.length - max} more` : shown.join(', ');
}

async function expectedGroups(options: Map<string, string>): Promise<{ groups: string[]; from: string } | null> {
  const list = options.get('expect');
  const data = options.get('data');
  const by = options.get('by');
  if (list !== undefined && (data !== undefined || by !== undefined)) throw new UsageError('Give the expected groups one way: --expect LIST, or --data FILE with --by COLUMN.');
  if (options.has('sheet') && data === undefined) throw new UsageError('--sheet goes with --data FILE --by COLUMN.');
  if (list !== undefined) {
    const path = resolve(list);
    let text: string;
    try {
      text = await readFile(path, 'utf8');
    } catch {
      throw new UsageError(`Cannot read the list of expected groups ${path}. Check the path.`);
    }
    const groups = [...new Set(text.replace(/^\uFEFF/, '').split(/\r?\n/).map((l) => l.trim()).filter((l) => l !== ''))];
    if (groups.length === 0) throw new UsageError(`The list ${basename(path)} names no group. Put one group a line.`);
    return { groups, from: basename(path) };
  }
  if (data === undefined && by === undefined) return null;
  if (data === undefined || by === undefined) throw new UsageError('--data and --by go together: the table and the column the shards were run on.');
  const table = await loadDataTable(resolve(data), { sheet: options.get('sheet') });
  const col = table.columns.find((c) => c.name === by);
  if (!col) throw new UsageError(`There is no column "${by}" in ${basename(data)}. The columns are: ${table.columns.map((c) => `"${c.name}"`).join(', ')}.`);
  return { groups: levelsOf(col), from: `column "${by}" of ${basename(data)}` };
}

function checkExpected(expected: readonly string[], from: string, found: readonly string[]): void {
  const want = new Set(expected);
  const have = new Set(found);
  const missing = sortLevels(expected.filter((g) => !have.has(g)));
  const extra = sortLevels(found.filter((g) => !want.has(g)));
  const faults: string[] = [];
  if (missing.length) faults.push(`${missing.length} expected group${missing.length > 1 ? 's are' : ' is'} missing: ${listed(missing)}; run the shards that hold ${missing.length > 1 ? 'them' : 'it'} and merge again.`);
  if (extra.length) faults.push(`${extra.length} group${extra.length > 1 ? 's are' : ' is'} not in ${from}: ${listed(extra)}; check that the outputs come from the same table and column.`);
  if (faults.length) throw new MergeRefused(`Not merged: ${faults.join(' ')}`);
}
