import { join, resolve } from 'node:path';
import { PROGRAMME_SLUG } from '@shared/demo/programme';
import { writeDemoCsv, writeDemoWorkbooks } from '../../../src-main/demo/write-workbooks';
import { parseArgs, requireOption } from '../args';
import type { CliCommand } from '../command';

export const demo: CliCommand = {
  name: 'demo',
  summary: 'Write the built-in demo programme (invented, simulated) as season workbooks.',
  usage: [
    '  tallywise demo --out DIR [--seed N] [--clean-table]',
    '',
    '  Writes one workbook per season into DIR, with the mess real tally sheets have,',
    '  and lists the files written. --clean-table also writes the simulated analysis',
    '  table before any mess (one row per pond, season and species) as CSV, for trying',
    '  `fit` and `trend` without cleaning first.',
  ].join('\n'),
  async run(argv, io) {
    const args = parseArgs(argv, { values: ['out', 'seed'], flags: ['clean-table'] });
    const out = resolve(requireOption(args, 'out', 'the folder to write the workbooks into'));
    const seedText = args.options.get('seed');
    const seed = seedText === undefined ? undefined : Number(seedText);
    if (seed !== undefined && !Number.isInteger(seed)) {
      io.err(`The seed must be a whole number, not "${seedText}".`);
      return 2;
    }
    const { files, planted } = await writeDemoWorkbooks(out, seed === undefined ? {} : { seed });
    for (const f of files) io.out(f);
    if (args.flags.has('clean-table')) {
      const csv = join(out, `${PROGRAMME_SLUG}-clean-table.csv`);
      writeDemoCsv({ ...(seed === undefined ? {} : { seed }), outFile: csv });
      io.out(csv);
    }
    io.err(`Wrote ${files.length} workbooks with ${planted.length} planted problems for cleaning practice.`);
    return 0;
  },
};
