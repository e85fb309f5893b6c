import { readFile } from 'node:fs/promises';
import { basename, extname, resolve } from 'node:path';
import { cleanedDataExport } from '@shared/export/build-export';
import { exportTableKeys, type ExportTableKey } from '@shared/export/export-model';
import type { ProjectDocument } from '@shared/project/document';
import packageJson from '../../../package.json';
import { demoProject } from '../../../src-main/demo/demo-project';
import { writeCleanedExport, exportFormatOf } from '../../../src-main/export/write-export';
import { projectAnalysis } from '../../../src-main/project/project-analysis';
import { loadProject } from '../../../src-main/project/project-store';
import { fingerprintOf } from '../../../src-main/report/project-report';
import { parseArgs, requireOption } from '../args';
import { UsageError, type CliCommand } from '../command';

export const exportData: CliCommand = {
  name: 'export',
  summary: 'Write a project\'s cleaned data (records, analysis table, changes) to a workbook or a CSV file.',
  usage: [
    '  tallywise export --project FILE --out FILE.xlsx|FILE.csv [--table NAME]',
    '  tallywise export --demo --out FILE.xlsx|FILE.csv [--table NAME]',
    '',
    '  --project  a saved project (.tallywise): its records with the cleaning replayed',
    '  --demo     the built-in demo project (invented, simulated) with its recorded cleaning',
    '  --out      the file to write: .xlsx holds every table (Records, Analysis table, Changes, About);',
    '             .csv holds one table (UTF-8, comma separated)',
    `  --table    with .csv: which table, one of ${exportTableKeys.join(', ')} (default: analysis)`,
    '',
    '  Prints the path written; a note on the counts goes to stderr.',
  ].join('\n'),
  async run(argv, io) {
    const args = parseArgs(argv, { values: ['project', 'out', 'table'], flags: ['demo'] });
    const modes = [args.options.has('project') && '--project', args.flags.has('demo') && '--demo'].filter(Boolean);
    if (modes.length !== 1) throw new UsageError(modes.length ? '--project and --demo cannot go together: give one of them.' : 'Say what to export: --project FILE (a saved project) or --demo.');
    const out = resolve(requireOption(args, 'out', 'the file to write (.xlsx or .csv)'));
    const format = exportFormatOf(out);
    if (!format) throw new UsageError(`--out "${basename(out)}" must end in .xlsx (every table) or .csv (one table).`);
    const table = tableOption(args.options.get('table'), format);

    let doc: ProjectDocument;
    let projectFile: { name: string; sha256: string } | null = null;
    let projectName: string;
    if (args.flags.has('demo')) {
      io.err('Demo project: importing the demo workbooks and replaying the recorded cleaning ...');
      doc = await demoProject();
      projectName = 'built-in demo project (invented, simulated data)';
    } else {
      const path = resolve(args.options.get('project')!);
      // A file that cannot be read names itself (ProjectFileError): printed as it is, exit status 2.
      doc = (await loadProject(path)).document;
      projectFile = fingerprintOf(path, await readFile(path));
      projectName = basename(path, extname(path));
    }
    const a = await projectAnalysis(doc);
    for (const p of a.siteProblems) io.err(`Site list: ${p}`);
    const exported = cleanedDataExport({
      analysis: a,
      sources: a.loaded,
      log: a.log,
      origin: {
        programme: doc.programme.name,
        project: { name: projectName, saved: !args.flags.has('demo') },
        projectFile,
        software: { name: 'Tallywise', version: packageJson.version },
        createdAt: new Date().toISOString(),
      },
    });
    const written = await writeCleanedExport(exported, out, table);
    const c = exported.counts;
    io.err(`Exported ${written.sheets.join(', ')}: ${c.records} records (${c.kept} kept, ${c.leftOut} left out), ${c.analysisRows} analysis rows.`);
    io.out(written.path);
    return 0;
  },
};

function tableOption(text: string | undefined, format: 'xlsx' | 'csv'): ExportTableKey | undefined {
  if (text === undefined) return undefined;
  if (format === 'xlsx') throw new UsageError('--table goes with a .csv file; a workbook (.xlsx) holds every table. Leave out --table or write a .csv file.');
  const key = text.trim().toLowerCase();
  if (!(exportTableKeys as readonly string[]).includes(key)) throw new UsageError(`--table takes one of ${exportTableKeys.join(', ')}, not "${text}".`);
  return key as ExportTableKey;
}
