import { readFile } from 'node:fs/promises';
import { basename, extname, resolve } from 'node:path';
import { findColumn, splitBy, type DataTable } from '@shared/data/table';
import { DEFAULT_DEMO_SEED } from '@shared/demo/truth';
import type { ModelSpec } from '@shared/model/spec';
import type { ProjectDocument } from '@shared/project/document';
import { reportStem } from '@shared/report/programme-plan';
import { COMPOSITE_STEP, DEFAULT_COMPOSITE_REPLICATES, runProgrammeReport, type ProgrammePlan, type ProgrammeProgress } from '@shared/report/programme-report';
import { poolRunner } from '@shared/trend/pool-runner';
import packageJson from '../../../package.json';
import { loadDataTable } from '../../../src-main/data/load-table';
import { demoProject } from '../../../src-main/demo/demo-project';
import { sha256Hex } from '../../../src-main/project/file-format';
import { loadProject } from '../../../src-main/project/project-store';
import { fingerprintOf, projectPlan } from '../../../src-main/report/project-report';
import { writeReportFiles } from '../../../src-main/report/write-report';
import { parseArgs, requireOption, wholeNumber, type ParsedArgs } from '../args';
import { progressPrinter } from '../progress';
import { UsageError, type CliCommand, type CliIO } from '../command';
import { readSpecFile } from '../spec-file';
import { createFitPool, defaultJobs } from '../worker/fit-pool';
import { interruptible } from '../interrupt';
import { verifyOutcome } from '../report-verify';

export const report: CliCommand = {
  name: 'report',
  summary: 'Write the annual trend report (one PDF, one HTML and one XLSX file) into a folder.',
  usage: [
    '  tallywise report --project FILE --out DIR [--species A,B] [options]',
    '  tallywise report --demo --out DIR [options]',
    '  tallywise report --data FILE --spec FILE --out DIR [--by COLUMN] [options]',
    '',
    '  --project     a saved project (.tallywise): its cleaned records and the model chosen for each species',
    '  --species A,B the species to report (default: those the project lists for its report, else every species with a chosen model)',
    '  --demo        the built-in demo project (invented, simulated): its import, recorded cleaning and chosen models',
    '  --data        a cleaned table (.csv or .xlsx); --sheet NAME picks a workbook sheet',
    '  --spec        the model spec (JSON) with a "time" entry, for --data',
    '  --by COLUMN   with --data: one section per value of COLUMN (e.g. species), and their composite index',
    '  --out         the folder to write the report into (made if missing)',
    '  --replicates N  bootstrap replicates of the composite\'s limits (default 199)',
    '  --seed S      seed of the composite bootstrap (default: the project\'s, else 1)',
    '  --jobs N      worker threads for the bootstrap refits (default: one per core; 0 = this process)',
    '  --title TEXT  the report title',
    '  --verify      with --project: set the report against the last one in the project\'s history and say whether it',
    '                reproduced it ("reproduced exactly") or which numbers differ; the project file is never written',
    '',
    '  Prints the paths of the three files written, one a line (with --verify, then the outcome); progress goes to stderr.',
    '  A project that keeps earlier reports gets the section "Since the last report".',
    '  Exit status 1 when a fit did not converge or a species could not be fitted (the report is still written),',
    '  or, with --verify, when the cleaned records and the models are the same as last time but the numbers are not.',
  ].join('\n'),
  async run(argv, io) {
    const args = parseArgs(argv, { values: ['data', 'spec', 'out', 'by', 'sheet', 'replicates', 'seed', 'jobs', 'title', 'project', 'species'], flags: ['demo', 'verify'] });
    const out = resolve(requireOption(args, 'out', 'the folder to write the report into'));
    const modes = [args.options.has('project') && '--project', args.flags.has('demo') && '--demo', args.options.has('data') && '--data'].filter(Boolean);
    if (modes.length !== 1) throw new UsageError(modes.length ? `${modes.join(' and ')} cannot go together: leave out ${modes.slice(1).join(' and ')}.` : 'Say what to report: --project FILE, --demo, or --data FILE --spec FILE.');
    if (!args.options.has('data') && (args.options.has('spec') || args.options.has('by') || args.options.has('sheet'))) {
      throw new UsageError(`${modes[0]} brings its own models and grouping (by species); leave out --spec, --by and --sheet (they go with --data).`);
    }
    if (args.flags.has('verify') && !args.options.has('project')) throw new UsageError('--verify goes with --project FILE: it sets the report against the last one kept in the project file.');
    if (args.options.has('data') && args.options.has('species')) throw new UsageError('--species goes with --project or --demo; with --data, use --by COLUMN.');
    const common = {
      replicates: wholeNumber(args, 'replicates', 20),
      seed: wholeNumber(args, 'seed', 0),
      software: { name: 'Tallywise', version: packageJson.version },
      createdAt: new Date().toISOString(),
      command: `tallywise report ${argv.map(shellWord).join(' ')}`,
    };
    const input = args.options.has('data') ? await fileInput(args, common) : await projectInput(args, common, io);
    const plan: ProgrammePlan = args.options.has('title') ? { ...input.plan, title: args.options.get('title')! } : input.plan;
    return runReport(plan, out, input.stem, wholeNumber(args, 'jobs', 0) ?? defaultJobs(), io, args.flags.has('verify'));
  },
};

type Common = { replicates?: number; seed?: number; software: { name: string; version: string }; createdAt: string; command: string };

interface ReportInput {
  plan: ProgrammePlan;
  stem: string;
}

async function runReport(plan: ProgrammePlan, out: string, stem: string, jobs: number, io: CliIO, verify = false): Promise<number> {
  const fitPool = plan.compositeTable ? createFitPool(jobs) : null;
  try {
    return await interruptible(io, () => 'Stopped: the report was interrupted; nothing was written.', async (signal) => {
      const { document, unsound, sinceLast } = await runProgrammeReport(plan, { signal, onProgress: progressLines(plan, io), runner: fitPool ? poolRunner(fitPool.pool, signal) : undefined });
      const written = await writeReportFiles(document, out, stem, (stage) => io.err(`Report: ${stage} ...`));
      io.out(written.pdf);
      io.out(written.html);
      io.out(written.xlsx);
      if (unsound.length) io.err(`Look at the report's warnings for ${unsound.join(', ')}: the fit did not converge or could not be made.`);
      const verified = verify ? verifyOutcome(sinceLast) : null;
      for (const line of verified?.lines ?? []) io.out(line);
      return unsound.length || verified?.failed ? 1 : 0;
    });
  } finally {
    fitPool?.pool.dispose();
  }
}

/** One line as each group starts, then the stages within it (a line per tenth of the bootstrap). */
function progressLines(plan: ProgrammePlan, io: CliIO): (p: ProgrammeProgress) => void {
  let stages = progressPrinter(io);
  let current: string | null = null;
  const what = plan.groupColumn === 'species' ? 'species' : `values of "${plan.groupColumn}"`;
  return (p) => {
    if (p.group !== current) {
      current = p.group;
      stages = progressPrinter(io);
      if (p.group === COMPOSITE_STEP) io.err(`Composite index of ${plan.groups.length} ${what} (${plan.replicates ?? DEFAULT_COMPOSITE_REPLICATES} bootstrap replicates) ...`);
      else if (p.group) io.err(`Trend for ${plan.groupColumn ?? 'group'} "${p.group}" ...`);
    }
    if (p.stage !== 'starting') stages(p.items?.done ?? 0, p.items?.total ?? 1, p.stage);
  };
}

async function projectInput(args: ParsedArgs, common: Common, io: CliIO): Promise<ReportInput> {
  const species = (args.options.get('species') ?? '').split(',').map((s) => s.trim()).filter(Boolean);
  let doc: ProjectDocument;
  let projectFile: { name: string; sha256: string } | null = null;
  if (args.flags.has('demo')) {
    io.err('Demo project: importing the demo workbooks and replaying the recorded cleaning ...');
    doc = await demoProject();
  } else {
    const path = resolve(args.options.get('project')!);
    // A file that cannot be read names itself (ProjectFileError): printed as it is, exit status 2.
    doc = (await loadProject(path)).document;
    projectFile = fingerprintOf(path, await readFile(path));
  }
  const { plan, siteProblems } = await projectPlan(doc, {
    ...common,
    species,
    projectFile,
    unsavedNote: args.flags.has('demo') ? 'The built-in demo project (invented, simulated data), rebuilt by `tallywise report --demo`: the demo workbooks imported, the recorded cleaning replayed and the recorded model of each species refitted.' : undefined,
  });
  for (const p of siteProblems) io.err(`Site list: ${p}`);
  if (!args.flags.has('demo')) return { plan, stem: reportStem(doc.programme.name) };
  const provenance = { ...plan.provenance, seeds: [{ what: 'the demo simulation', value: DEFAULT_DEMO_SEED }, ...plan.provenance.seeds] };
  return { plan: { ...plan, title: `${plan.title} (invented, simulated data)`, provenance }, stem: reportStem(doc.programme.name) };
}

async function fileInput(args: ParsedArgs, common: Common): Promise<ReportInput> {
  const dataPath = resolve(requireOption(args, 'data', 'the data file'));
  const spec = await readSpecFile(resolve(requireOption(args, 'spec', 'the model spec file')));
  if (!spec.time) throw new UsageError('The model spec has no "time" entry, so there is no trend to report. Add e.g. "time": { "column": "season", "trend": "annual" } to the spec.');
  const table = await loadDataTable(dataPath, { sheet: args.options.get('sheet') });
  const by = args.options.get('by');
  const name = basename(dataPath);
  const source = { name: args.options.has('sheet') ? `${name}, sheet "${args.options.get('sheet')}"` : name, sha256: sha256Hex(await readFile(dataPath)), rows: table.nrows };
  const plan: ProgrammePlan = {
    title: `Trend report: ${name}`,
    subtitle: by ? `Trend of each ${by}, ${spec.time.column} by ${spec.time.column}` : undefined,
    groupColumn: by,
    groups: groupsOf(table, spec, by),
    compositeTable: by ? table : undefined,
    provenance: { software: common.software, inputs: [source], seeds: [], createdAt: common.createdAt, command: common.command },
    replicates: common.replicates,
    seed: common.seed,
  };
  return { plan, stem: `${basename(name, extname(name))}-trend-report` };
}

function groupsOf(table: DataTable, spec: ModelSpec, by: string | undefined): ProgrammePlan['groups'] {
  if (by === undefined) return [{ group: '', table, spec }];
  if (!findColumn(table, by)) throw new UsageError(`There is no column "${by}" to group by (--by). The columns are: ${table.columns.map((c) => `"${c.name}"`).join(', ')}.`);
  const groups = splitBy(table, by).filter((g) => g.key !== '');
  if (groups.length === 0) throw new UsageError(`The column "${by}" (--by) has no non-blank values, so there are no groups to report.`);
  return groups.map((g) => ({ group: g.key, table: g.table, spec }));
}

const shellWord = (w: string) => (/^[\w@%+=:,./-]+$/.test(w) ? w : `'${w.replace(/'/g, `'\\''`)}'`);
