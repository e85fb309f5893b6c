import { parseArgs } from '../args';
import { UsageError, type CliCommand, type CliIO } from '../command';
import { capFindings, formatFinding } from '../../../src-shared/import/findings';
import { ImportError } from '../../../src-shared/import/import-error';
import { checkFile, type CheckOptions } from '../../../src-main/import/check-file';

/** `tallywise check FILE`: reads a tally file and lists what needs fixing. The work is done by src-main/import/check-file.ts. */
const usage = `Usage: tallywise check FILE [--template T] [--sheet NAME] [--date-order dmy|mdy] [--decimal-mark .|,] [--all] [--json]
  FILE            an .xlsx workbook or a .csv/.txt file
  --template T    a mapping template (JSON) saying which column is which; without it the columns are guessed
  --sheet NAME    the sheet to check (default: the template's sheet, or the first visible sheet)
  --date-order    how to read dates like 03/05/2019: dmy (day first) or mdy (month first)
  --decimal-mark  the decimal mark of a CSV file, when it cannot be told from the numbers
  --all           list every finding (by default at most 20 of each kind)
  --json          print one JSON object instead of text
  --debug         show the program detail behind an unexpected failure
Exit status: 0 nothing to fix, 1 findings need action, 2 bad usage or unreadable file.`;

interface Parsed {
  file: string;
  options: CheckOptions;
  json: boolean;
  all: boolean;
  debug: boolean;
}

function readArgs(args: string[]): Parsed {
  const a = parseArgs(args, { values: ['template', 'sheet', 'date-order', 'decimal-mark'], flags: ['json', 'all'] });
  if (a.positional.length === 0) throw new UsageError(`Give the file to check.\n${usage}`);
  if (a.positional.length > 1) throw new UsageError(`check takes one file; "${a.positional[1]}" is one too many.\n${usage}`);
  const dateOrder = a.options.get('date-order');
  if (dateOrder !== undefined && dateOrder !== 'dmy' && dateOrder !== 'mdy') throw new UsageError(`--date-order takes dmy or mdy, not "${dateOrder}".`);
  const decimalMark = a.options.get('decimal-mark');
  if (decimalMark !== undefined && decimalMark !== '.' && decimalMark !== ',') throw new UsageError(`--decimal-mark takes . or , (not "${decimalMark}").`);
  return {
    file: a.positional[0],
    options: { template: a.options.get('template'), sheet: a.options.get('sheet'), dateOrder, decimalMark },
    json: a.flags.has('json'),
    all: a.flags.has('all'),
    debug: a.flags.has('debug'),
  };
}

function plural(n: number, word: string): string {
  return `${n} ${word}${n === 1 ? '' : 's'}`;
}

async function run(args: string[], io: CliIO): Promise<number> {
  let parsed: Parsed;
  try {
    parsed = readArgs(args);
  } catch (e) {
    io.err((e as Error).message);
    return e instanceof UsageError ? e.status : 2;
  }
  try {
    const report = await checkFile(parsed.file, parsed.options);
    if (parsed.json) {
      io.out(JSON.stringify({
        file: report.file, sheet: report.sheet, status: report.needsAction ? 'needs-action' : 'clean', templateSource: report.templateSource,
        encoding: report.encoding ?? null, summary: report.summary, questions: report.questions, findings: report.findings, mapping: report.template,
      }, null, 2));
      return report.needsAction ? 1 : 0;
    }
    const s = report.summary;
    io.out(`Checked ${report.file}${report.sheet ? `, sheet "${report.sheet}"` : ''}${report.encoding ? ` (read as ${report.encoding})` : ''}: ${plural(s.rows, 'row')}, ${plural(s.records, 'count record')}, ${plural(s.sites, 'site')}, ${s.species} species, ${plural(s.seasons, 'season')}.`);
    for (const q of report.questions) io.out(`question: ${q.sheet ? `sheet "${q.sheet}", ` : ''}column ${q.column} ("${q.columnName}"): ${q.message}\n  fix: run again with --date-order dmy or --date-order mdy (or set dateOrder in the template).`);
    const shown = parsed.all ? report.findings : capFindings(report.findings, 20);
    for (const f of shown) io.out(formatFinding(f));
    const n = (sev: string) => report.findings.filter((f) => f.severity === sev).length;
    io.out(`${plural(n('error'), 'error')}, ${plural(n('warning'), 'warning')}, ${plural(n('info'), 'note')}${report.questions.length ? `, ${plural(report.questions.length, 'open question')}` : ''}.`);
    return report.needsAction ? 1 : 0;
  } catch (e) {
    if (e instanceof ImportError) {
      io.err(e.message);
      return 2;
    }
    io.err(`Checking ${parsed.file} failed unexpectedly: ${(e as Error).message}. Run again with --debug and report the output.`);
    if (parsed.debug) io.err(String((e as Error).stack));
    return 2;
  }
}

export const check: CliCommand = { name: 'check', summary: 'Read a tally file and list what needs fixing before modelling.', usage, run };
