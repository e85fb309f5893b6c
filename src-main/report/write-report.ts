/** Writes a report document as .html, .xlsx and .pdf into a folder. */
import { mkdir, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import { renderHtml } from '@shared/report/html';
import type { ReportDocument } from '@shared/report/model';
import { reportPdf } from './pdf';
import { renderDocumentCharts } from './svg';
import { reportWorkbook } from './xlsx';

export interface WrittenReport {
  readonly pdf: string;
  readonly html: string;
  readonly xlsx: string;
}

/** A report file could not be written; the message names the file and the fix. */
export class ReportWriteError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ReportWriteError';
  }
}

export async function writeReportFiles(doc: ReportDocument, outDir: string, stem: string, onProgress: (stage: string) => void = () => {}): Promise<WrittenReport> {
  onProgress('drawing the charts');
  const svgs = renderDocumentCharts(doc);
  const paths: WrittenReport = { pdf: join(outDir, `${stem}.pdf`), html: join(outDir, `${stem}.html`), xlsx: join(outDir, `${stem}.xlsx`) };
  onProgress('writing the HTML');
  const html = renderHtml(doc, svgs);
  onProgress('writing the workbook');
  const xlsx = await reportWorkbook(doc);
  onProgress('writing the PDF');
  const pdf = await reportPdf(doc, svgs);
  let at: string = outDir;
  try {
    await mkdir(outDir, { recursive: true });
    for (const [path, bytes] of [[paths.pdf, pdf], [paths.html, html], [paths.xlsx, xlsx]] as const) {
      at = path;
      await writeFile(path, bytes);
    }
  } catch (err) {
    const code = (err as { code?: unknown })?.code;
    throw new ReportWriteError(`Could not write "${at}" (${typeof code === 'string' ? code : (err as Error).message}). Choose a folder you can write to, with free space.`);
  }
  return paths;
}
