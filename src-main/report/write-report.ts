/** Writes a report document as .html, .xlsx and .pdf into a folder. */
import { mkdir, writeFile } from 'node:fs/promises';
import { basename, join } from 'node:path';
import { renderHtml } from '@shared/report/html';
import type { ReportDocument } from '@shared/report/model';
import { sha256Hex } from '../project/file-format';
import { reportPdf } from './pdf';
import { renderDocumentCharts } from './svg';
import { reportWorkbook } from './xlsx';

export interface WrittenReport {
  readonly pdf: string;
  readonly html: string;
  readonly xlsx: string;
  /** Name and SHA-256 of each file, taken from the bytes written (pdf, html, xlsx). */
  readonly files: { name: string; sha256: string }[];
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
  const paths = { pdf: join(outDir, `${stem}.pdf`), html: join(outDir, `${stem}.html`), xlsx: join(outDir, `${stem}.xlsx`) };
  onProgress('writing the HTML');
  const html = Buffer.from(renderHtml(doc, svgs), 'utf8');
  onProgress('writing the workbook');
  const xlsx = await reportWorkbook(doc);
  onProgress('writing the PDF');
  const pdf = await reportPdf(doc, svgs);
  const written = [[paths.pdf, pdf], [paths.html, html], [paths.xlsx, xlsx]] as const;
  let at: string = outDir;
  try {
    await mkdir(outDir, { recursive: true });
    for (const [path, bytes] of written) {
      at = path;
      await writeFile(path, bytes);
    }
  } catch (err) {
    const code = (err as { code?: unknown })?.code;
    throw new ReportWriteError(`Could not write "${at}" (${typeof code === 'string' ? code : (err as Error).message}). Choose a folder you can write to, with free space.`);
  }
  const files = written.map(([path, bytes]) => ({ name: basename(path), sha256: sha256Hex(bytes) }));
  return { ...paths, files };
}
