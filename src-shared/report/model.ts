/**
 * The report model: a typed document of sections made of paragraphs, tables,
 * charts, cautions and lists, plus the long-form tables a spreadsheet holds
 * and a reproducibility appendix. Every string that came from the data is
 * kept here as plain text; escaping is each renderer's job.
 */
import type { ChartOption } from '../charts/chart-style';

/** How a number in a table is shown. Non-finite numbers are shown as a dash, never as NaN. */
export type NumberFormat =
  | { readonly kind: 'fixed'; readonly decimals: number }
  /** A fraction shown as a percentage (0.031 -> 3.1%). */
  | { readonly kind: 'percent'; readonly decimals: number }
  /** A p-value: four decimals, "<0.0001" below that. */
  | { readonly kind: 'p' }
  | { readonly kind: 'integer' }
  /** The number as it is written (seasons such as 2012). */
  | { readonly kind: 'general' };

export type Cell = string | number | null;

export interface TableColumnSpec {
  readonly header: string;
  /** Format of the numbers in this column (text cells ignore it). */
  readonly format?: NumberFormat;
}

export interface TableBlock {
  readonly kind: 'table';
  readonly id: string;
  readonly caption: string;
  readonly columns: readonly TableColumnSpec[];
  readonly rows: readonly (readonly Cell[])[];
  /** Footnotes printed under the table. */
  readonly notes?: readonly string[];
}

export interface ParagraphBlock {
  readonly kind: 'paragraph';
  readonly text: string;
  /** Keys of `ReportDocument.references` this paragraph cites. */
  readonly cites?: readonly string[];
  /** A lead sentence shown with emphasis (the summary of a section). */
  readonly emphasis?: boolean;
}

export interface ChartBlock {
  readonly kind: 'chart';
  readonly id: string;
  readonly option: ChartOption;
  /** Plain-text description of the chart for readers who cannot see it. */
  readonly alt: string;
  readonly width: number;
  readonly height: number;
}

export interface CautionBlock {
  readonly kind: 'caution';
  readonly title: string;
  readonly items: readonly string[];
}

export interface ListBlock {
  readonly kind: 'list';
  readonly title?: string;
  readonly items: readonly string[];
}

/** Preformatted text (the spec as JSON). */
export interface CodeBlock {
  readonly kind: 'code';
  readonly title: string;
  readonly text: string;
}

export type Block = ParagraphBlock | TableBlock | ChartBlock | CautionBlock | ListBlock | CodeBlock;

export interface Section {
  readonly id: string;
  readonly heading: string;
  readonly blocks: readonly Block[];
  /** Printed straight after the section before it, without starting a page (a short section). */
  readonly continues?: boolean;
}

export interface Reference {
  readonly key: string;
  readonly text: string;
}

/** A long-form table for a spreadsheet sheet (one sheet per table). */
export interface SheetTable {
  /** Sheet name: at most 31 characters, none of : \ / ? * [ ]. */
  readonly name: string;
  readonly table: TableBlock;
}

export interface ReportDocument {
  readonly title: string;
  readonly subtitle: string;
  /** ISO 8601 date-time the report was made. */
  readonly createdAt: string;
  readonly sections: readonly Section[];
  readonly appendix: Section;
  readonly references: readonly Reference[];
  readonly sheets: readonly SheetTable[];
}

/** Every chart block of a document, in reading order (renderers draw these). */
export function chartBlocks(doc: ReportDocument): ChartBlock[] {
  return [...doc.sections, doc.appendix].flatMap((s) => s.blocks.filter((b): b is ChartBlock => b.kind === 'chart'));
}
