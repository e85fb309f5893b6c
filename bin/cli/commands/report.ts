import { createHash } from 'node:crypto';
import { readFile } from 'node:fs/promises';
import { basename, extname, resolve } from 'node:path';
import Papa from 'papaparse';
import { findColumn, splitBy, tableFromTexts, type DataTable } from '@shared/data/table';
import { DEFAULT_DEMO_SEED, DEMO_TRUTH } from '@shared/demo/truth';
import { FitCancelled } from '@shared/engine/types';
import { parseModelSpec, type ModelSpec } from '@shared/model/spec';
import type { Provenance } from '@shared/report/appendix';
import { buildTrendReport } from '@shared/report/build';
import type { GroupTrend } from '@shared/report/group-section';
import { compositeTrend, type CompositeResult } from '@shared/trend/composite';
import { decisionFlags } from '@shared/trend/flags';
import { poolRunner } from '@shared/trend/pool-runner';
import { analyseTrend, type TrendOptions } from '@shared/trend/trend-analysis';
import demoSpecJson from '../../../resources/demo/trend-spec.json';
import packageJson from '../../../package.json';
import { loadDataTable } from '../../../src-main/data/load-table';
import { writeDemoCsv } from '../../../src-main/demo/write-workbooks';
import { writeReportFiles } from '../../../src-main/report/write-report';
import { parseArgs, requireOption, wholeNumber, type ParsedArgs } from '../args';
import { progressPrinter } from '../progress';
import { UsageError, type CliCommand, type CliIO } from '../command';
import { readSpecFile } from '../spec-file';
import { createFitPool, defaultJobs } from '../worker/fit-pool';

const DEFAULT_COMPOSITE_REPLICATES = 199;

export const report: CliCommand = {
  name: 'report',
  summary: 'Write the annual trend report (one PDF, one HTML and one XLSX file) into a folder.',
  usage: [
    '  tallywise report --data FILE --spec FILE --out DIR [--by COLUMN] [options]',
    '  tallywise report --demo --out DIR [options]',
    '',
    '  --data        the cleaned table (.csv or .xlsx); --sheet NAME picks a workbook sheet',
    '  --spec        the model spec (JSON) with a "time" entry',
    '  --out         the folder to write the report into (made if missing)',
    '  --by COLUMN   one section per value of COLUMN (e.g. species), and their composite index',
    '  --demo        the built-in demo programme (invented, simulated): its clean table and trend spec, by species',
    `  --replicates N  bootstrap replicates of the composite's limits (default ${DEFAULT_COMPOSITE_REPLICATES})`,
    '  --seed S      seed of the composite bootstrap (default 1)',
    '  --jobs N      worker threads for the bootstrap refits (default: one per core; 0 = this process)',
    '  --title TEXT  the report title',
    '',
    '  Prints the paths of the three files written, one a line; progress goes to stderr.',
    '  Exit status 1 when a fit did not converge or a group could not be fitted (the report is still written).',
  ].join('\n'),
  async run(argv, io) {
    const args = parseArgs(argv, { values: ['data', 'spec', 'out', 'by', 'sheet', 'replicates', 'seed', 'jobs', 'title', 'project'], flags: ['demo'] });
    if (args.options.has('project')) {
      throw new UsageError('report --project is not yet available. Export the cleaned table and the spec from the project and use --data FILE --spec FILE, or try --demo.');
    }
    const out = resolve(requireOption(args, 'out', 'the folder to write the report into'));
    const demo = args.flags.has('demo');
    if (demo && (args.options.has('data') || args.options.has('spec') || args.options.has('by'))) {
      throw new UsageError('--demo brings its own table, spec and grouping (by species); leave out --data, --spec and --by.');
    }
    const input = demo ? await demoInput() : await fileInput(args);
    if (!input.spec.time) throw new UsageError('The model spec has no "time" entry, so there is no trend to report. Add e.g. "time": { "column": "season", "trend": "annual" } to the spec.');
    if (input.by !== undefined && !findColumn(input.table, input.by)) {
      throw new UsageError(`There is no column "${input.by}" to group by (--by). The columns are: ${input.table.columns.map((c) => `"${c.name}"`).join(', ')}.`);
    }
    const replicates = wholeNumber(args, 'replicates', 20);
    const seed = wholeNumber(args, 'seed', 0) ?? 1;
    const jobs = wholeNumber(args, 'jobs', 0) ?? defaultJobs();
    const stop = new AbortController();
    const onInterrupt = () => stop.abort();
    process.once('SIGINT', onInterrupt);
    const wantsComposite = input.by !== undefined && input.spec.site !== undefined;
    const fitPool = wantsComposite ? createFitPool(jobs) : null;
    try {
      const options: TrendOptions = { signal: stop.signal, onProgress: progressPrinter(io) };
      const groups = await groupTrends(input.table, input.spec, input.by, input.labels, options, io);
      const cautions: string[] = [];
      let composite: CompositeResult['composite'] | undefined;
      const fittedGroups = groups.filter((g) => g.result).length;
      if (input.by !== undefined && !input.spec.site) cautions.push('There is no composite index: its limits resample whole sites, and the spec has no "site" entry.');
      else if (fitPool && fittedGroups >= 2 && fittedGroups === groups.length) {
        io.err(`Composite index of ${groups.length} groups (${replicates ?? DEFAULT_COMPOSITE_REPLICATES} bootstrap replicates) ...`);
        composite = (await compositeTrend(input.table, input.spec, input.by!, { replicates: replicates ?? DEFAULT_COMPOSITE_REPLICATES, seed, runner: poolRunner(fitPool.pool, stop.signal), signal: stop.signal, onProgress: options.onProgress })).composite;
      } else if (input.by !== undefined && fittedGroups < groups.length) cautions.push('There is no composite index, because not every group could be fitted.');
      const provenance: Provenance = {
        software: { name: 'Tallywise', version: packageJson.version },
        inputs: [input.source],
        seeds: [...(input.demoSeed !== undefined ? [{ what: 'the demo simulation', value: input.demoSeed }] : []), ...(composite ? [{ what: 'the composite bootstrap', value: composite.seed }] : [])],
        createdAt: new Date().toISOString(),
        command: `tallywise report ${argv.map(shellWord).join(' ')}`,
      };
      const doc = buildTrendReport({
        title: args.options.get('title') ?? input.title,
        subtitle: input.by ? `Trend of each ${input.by}, ${input.spec.time.column} by ${input.spec.time.column}` : undefined,
        spec: input.spec,
        groupColumn: input.by,
        groups,
        composite,
        cautions,
        provenance,
      });
      const written = await writeReportFiles(doc, out, input.stem, (stage) => io.err(`Report: ${stage} ...`));
      io.out(written.pdf);
      io.out(written.html);
      io.out(written.xlsx);
      return groups.every((g) => g.result?.fit.converged) ? 0 : 1;
    } catch (err) {
      if (err instanceof FitCancelled) {
        io.err('Stopped: the report was interrupted; nothing was written.');
        return 130;
      }
      throw err;
    } finally {
      process.off('SIGINT', onInterrupt);
      fitPool?.pool.dispose();
    }
  },
};

interface ReportData {
  table: DataTable;
  spec: ModelSpec;
  by?: string;
  labels: Readonly<Record<string, string>>;
  source: Provenance['inputs'][number];
  demoSeed?: number;
  title: string;
  stem: string;
}

const sha256 = (bytes: Uint8Array | string) => createHash('sha256').update(bytes).digest('hex');

async function fileInput(args: ParsedArgs): Promise<ReportData> {
  const dataPath = resolve(requireOption(args, 'data', 'the data file'));
  const spec = await readSpecFile(resolve(requireOption(args, 'spec', 'the model spec file')));
  const table = await loadDataTable(dataPath, { sheet: args.options.get('sheet') });
  const bytes = await readFile(dataPath);
  const name = basename(dataPath);
  return {
    table,
    spec,
    by: args.options.get('by'),
    labels: {},
    source: { name: args.options.has('sheet') ? `${name}, sheet "${args.options.get('sheet')}"` : name, sha256: sha256(bytes), rows: table.nrows },
    title: `Trend report: ${name}`,
    stem: `${basename(name, extname(name))}-trend-report`,
  };
}

async function demoInput(): Promise<ReportData> {
  const text = writeDemoCsv({ seed: DEFAULT_DEMO_SEED });
  const parsed = Papa.parse<string[]>(text.trim(), { skipEmptyLines: true });
  const [header, ...rows] = parsed.data;
  const table = tableFromTexts(header, rows);
  return {
    table,
    spec: parseModelSpec(demoSpecJson, 'The demo trend spec'),
    by: 'species',
    labels: Object.fromEntries(DEMO_TRUTH.species.map((s) => [s.key, s.label])),
    source: { name: 'demo clean table (simulated)', sha256: sha256(text), rows: table.nrows },
    demoSeed: DEFAULT_DEMO_SEED,
    title: 'Demo programme: annual trend report (invented, simulated data)',
    stem: 'demo-trend-report',
  };
}

async function groupTrends(table: DataTable, spec: ModelSpec, by: string | undefined, labels: Readonly<Record<string, string>>, options: TrendOptions, io: CliIO): Promise<GroupTrend[]> {
  if (by === undefined) {
    const result = await analyseTrend(table, spec, options);
    return [{ group: '', result, flags: decisionFlags(result.slope) }];
  }
  const out: GroupTrend[] = [];
  for (const g of splitBy(table, by).filter((x) => x.key !== '')) {
    io.err(`Trend for ${by} "${g.key}" ...`);
    try {
      const result = await analyseTrend(g.table, spec, options);
      out.push({ group: g.key, label: labels[g.key], result, flags: decisionFlags(result.slope) });
    } catch (err) {
      if (err instanceof FitCancelled) throw err;
      out.push({ group: g.key, label: labels[g.key], error: (err as Error).message });
    }
  }
  if (out.length === 0) throw new UsageError(`The column "${by}" (--by) has no non-blank values, so there are no groups to report.`);
  return out;
}

const shellWord = (w: string) => (/^[\w@%+=:,./-]+$/.test(w) ? w : `'${w.replace(/'/g, `'\\''`)}'`);

