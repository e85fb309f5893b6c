/** The report module's public API: the document model, its builders and the HTML renderer. */
export type { Block, Cell, CautionBlock, ChartBlock, CodeBlock, ListBlock, NumberFormat, ParagraphBlock, Reference, ReportDocument, Section, SheetTable, TableBlock, TableColumnSpec } from './model';
export { chartBlocks } from './model';
export { buildTrendReport } from './build';
export type { ReportInput } from './build';
export type { GroupTrend } from './group-section';
export type { Provenance } from './appendix';
export { summarySentence, changeOverSpan } from './summary-sentence';
export { compositeSentence } from './composite-section';
export { GENERAL_CAUTIONS } from './cautions';
export { REFERENCES } from './references';
export { formatNumber, cellText, spreadsheetFormat } from './number-format';
export { escapeHtml, unsafeSvgReason } from './escape';
export { renderHtml } from './html';
export type { ChartSvgs } from './html';
