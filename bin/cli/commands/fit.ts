import { resolve } from 'node:path';
import { findColumn, type DataTable } from '@shared/data/table';
import { rowList } from '@shared/engine/design/build';
import { fitModel } from '@shared/engine/fit';
import { FitInputError } from '@shared/engine/types';
import type { ModelSpec } from '@shared/model/spec';
import { fitGroupsOnPool } from '@shared/worker/fit-batch';
import { planGroups, type Shard } from '@shared/worker/fit-groups';
import { groupLine, needsAttention } from '@shared/worker/group-lines';
import { specColumns } from '@shared/engine/frame';
import { loadDataTable } from '../../../src-main/data/load-table';
import { parseArgs, requireOption } from '../args';
import { UsageError, type CliIO } from '../command';
import type { CliCommand } from '../command';
import { fitAsText } from '../format/fit-text';
import { readSpecFile } from '../spec-file';
import { createFitPool, defaultJobs } from '../worker/fit-pool';
import { interruptible } from '../interrupt';

export const fit: CliCommand = {
  name: 'fit',
  summary: 'Fit one count model to a cleaned table and print its estimates.',
  usage: [
    '  tallywise fit --data FILE --spec FILE [--sheet NAME] [--json]',
    '  tallywise fit --data FILE --spec FILE --by COLUMN [--shard I/N] [--jobs N] [--sheet NAME]',
    '',
    '  --data   the cleaned table: .csv (comma or semicolon) or .xlsx, column names in the first row',
    '  --spec   the model spec (JSON): response, distribution, predictors, offsets, site, time',
    '  --sheet  the workbook sheet to read (default: the first)',
    '  --json   print one JSON object instead of the readable summary',
    '  --by     fit the spec to each group of this column (e.g. species) separately, in parallel;',
    '           prints one JSON line per group as it finishes:',
    '             {"group": "...", "fit": {...the --json object...}}',
    '             {"group": "...", "error": {"name": "...", "message": "..."}}  (a group that could not be fitted)',
    '           rows with a blank cell in the column belong to no group and are not fitted',
    '  --shard  with --by: fit only part I of N (1 <= I <= N): the groups whose position in the sorted',
    '           list of all groups, counting from 0, is I-1 modulo N; shards 1/N .. N/N together fit every',
    '           group once, so they can run on different machines; join their outputs with `tallywise merge`',
    '  --jobs   with --by: worker threads to use (default: one per core); 0 fits in this process',
    '',
    '  Progress goes to stderr. Exit status 1 when the model (with --by: any group) did not converge',
    '  or a group could not be fitted; 2 for bad usage or unreadable input; 130 when --by was',
    '  interrupted with Ctrl-C (the lines printed before are complete).',
  ].join('\n'),
  async run(argv, io) {
    const args = parseArgs(argv, { values: ['data', 'spec', 'sheet', 'by', 'shard', 'jobs'], flags: ['json'] });
    const by = args.options.get('by');
    if (by === undefined) {
      for (const name of ['shard', 'jobs']) {
        if (args.options.has(name)) throw new UsageError(`--${name} goes with --by COLUMN (fitting each group of a column); add --by or leave out --${name}.`);
      }
    }
    const dataPath = resolve(requireOption(args, 'data', 'the data file'));
    const spec = await readSpecFile(resolve(requireOption(args, 'spec', 'the model spec file')));
    const shard = parseShard(args.options.get('shard'));
    const jobs = parseJobs(args.options.get('jobs'));
    const table = await loadDataTable(dataPath, { sheet: args.options.get('sheet') });
    if (by !== undefined) return fitByGroup(table, spec, { by, shard, jobs }, io);
    const outcome = withFileRows(() => fitModel(table, spec), dataPath);
    if (args.flags.has('json')) io.out(JSON.stringify(outcome.summary, null, 2));
    else io.out(fitAsText(outcome.summary));
    return outcome.summary.converged ? 0 : 1;
  },
};

/** Adds where a data row stands in the file to the engine's message (data row i is file row i + 1, after the header). */
export function withFileRows<T>(fit: () => T, file: string): T {
  try {
    return fit();
  } catch (err) {
    if (err instanceof FitInputError && err.rows.length > 0) {
      const first = err.rows[0] + 1;
      throw new FitInputError(err.code, `${err.message} (In ${file}, data row ${first} is row ${first + 1}, counting the header row.)`, err.rows);
    }
    throw err;
  }
}

function parseShard(text: string | undefined): Shard | undefined {
  if (text === undefined) return undefined;
  const m = /^(\d+)\/(\d+)$/.exec(text.trim());
  const index = m ? Number(m[1]) : NaN;
  const count = m ? Number(m[2]) : NaN;
  if (!(count >= 1 && index >= 1 && index <= count)) {
    throw new UsageError(`--shard takes I/N, part I of N parts with 1 <= I <= N (e.g. --shard 2/5), not "${text}".`);
  }
  return { index, count };
}

function parseJobs(text: string | undefined): number | undefined {
  if (text === undefined) return undefined;
  if (!/^\d+$/.test(text.trim())) throw new UsageError(`--jobs takes a whole number of worker threads (0 fits in this process), not "${text}".`);
  return Number(text);
}

/** `fit --by`: one fit per group across the pool, one JSON line per group in the order they finish. */
async function fitByGroup(table: DataTable, spec: ModelSpec, opts: { by: string; shard?: Shard; jobs?: number }, io: CliIO): Promise<number> {
  const { by, shard } = opts;
  const used = [spec.response, ...spec.offsets.map((o) => o.column), ...specColumns(spec)];
  if (used.includes(by)) {
    throw new UsageError(`--by "${by}" is a column of the model spec; within one group it would hold a single value. Group by another column, or take "${by}" out of the spec.`);
  }
  // A column missing from the table would fail every group alike: say it once, as bad input.
  const names = table.columns.map((c) => `"${c.name}"`).join(', ');
  if (!findColumn(table, by)) throw new UsageError(`There is no column "${by}" to group by (--by). The columns are: ${names}.`);
  const absent = used.find((c) => !findColumn(table, c));
  if (absent !== undefined) throw new UsageError(`The model spec uses the column "${absent}", which the data file does not have. The columns are: ${names}. Check the spelling in the spec.`);
  const plan = planGroups(table, by, shard);
  if (plan.allKeys.length === 0) throw new UsageError(`The column "${by}" given to --by has no values, so there is no group to fit.`);
  if (plan.blankRows.length) {
    io.err(`${plan.blankRows.length} row${plan.blankRows.length > 1 ? 's have' : ' has'} a blank "${by}" and belong${plan.blankRows.length > 1 ? '' : 's'} to no group; not fitted (data row${plan.blankRows.length > 1 ? 's' : ''} ${rowList(plan.blankRows)}).`);
  }
  const part = shard ? ` (shard ${shard.index}/${shard.count} of ${plan.allKeys.length} groups)` : '';
  if (plan.jobs.length === 0) {
    io.err(`Shard ${shard!.index}/${shard!.count} holds no group: "${by}" has only ${plan.allKeys.length}. Nothing to fit.`);
    return 0;
  }
  const jobs = Math.min(opts.jobs ?? defaultJobs(), plan.jobs.length);
  const { pool, mode } = createFitPool(jobs);
  const where = mode === 'threads' ? `on ${pool.size} worker thread${pool.size > 1 ? 's' : ''}` : 'in this process, one group at a time';
  io.err(`Fitting ${plan.jobs.length} group${plan.jobs.length > 1 ? 's' : ''} of "${by}"${part} ${where}.`);
  let attention = 0;
  let finished = 0;
  // Ctrl-C stops the workers at once; the lines already printed stay whole.
  const stopped = () => `Stopped after ${finished} of ${plan.jobs.length} groups; the lines printed are complete, the other groups were not fitted.`;
  try {
    const exit = await interruptible(io, stopped, async (signal) => {
      await fitGroupsOnPool(pool, plan.jobs, spec, {
        signal,
        onResult(result, done, total) {
          finished = done;
          const line = groupLine(result);
          io.out(JSON.stringify(line));
          if (needsAttention(line)) attention++;
          const status = 'error' in line ? `failed: ${line.error.message}` : line.fit.converged ? `converged (${line.fit.iterations} iterations)` : `did not converge in ${line.fit.iterations} iterations`;
          io.err(`[${done}/${total}] ${line.group}: ${status}`);
        },
      });
      return 0;
    });
    if (exit !== 0) return exit;
  } finally {
    pool.dispose();
  }
  if (attention) io.err(`${attention} of ${plan.jobs.length} group${plan.jobs.length > 1 ? 's' : ''} did not converge or could not be fitted; see their lines.`);
  return attention ? 1 : 0;
}
