/**
 * Tallywise's colours and marks. The six series colours are our own
 * choice, made to two rules and tested against both
 * (test/charts/palette-contrast.test.ts, test/charts/palette-vision.test.ts):
 * - each reaches at least 3:1 contrast with the white chart background, as
 *   WCAG 2.1 asks of the graphics needed to read a chart (success criterion
 *   1.4.11, non-text contrast);
 * - each stays well apart from the others and from the observed grey for
 *   normal vision and under simulated protanopia, deuteranopia and
 *   tritanopia, so the set leans on lightness and on the blue-yellow axis
 *   rather than on red against green.
 * Models take the colours in turn; observed data are always grey, so "what
 * was counted" never looks like a model. Where series overlap (the model
 * lines of one chart) colour is never the only difference: the k-th model
 * also gets the k-th symbol and line dash (`seriesMark`).
 */

/** Series colours in the order models receive them. */
export const seriesColours = [
  '#3D3AB0', // indigo
  '#C9651A', // burnt orange
  '#066A52', // deep teal
  '#A3309A', // magenta
  '#62300F', // dark brown
  '#2F88D8', // azure
] as const;

export const greys = {
  /** Titles and labels. */
  ink: '#1F2328',
  /** Axis lines and secondary text. */
  axis: '#5C6370',
  /** Grid lines. */
  grid: '#E4E6EA',
  /** Observed data (bars, points). */
  observed: '#8C939D',
  /** Fill of limits and envelope bands. */
  band: '#C9D6E3',
  /** The edges of a band (the fill alone is too light to read against the background). */
  bandEdge: '#7A8799',
} as const;

/** Points or bars that call for a look (outside an envelope, flagged); drawn with its own symbol too. */
export const attention = '#C0262D';
export const attentionSymbol = 'triangle';

export type LineDash = 'solid' | number[];

export interface SeriesMark {
  /** An echarts symbol name. */
  readonly symbol: string;
  /** A line's dash: solid, or the lengths of dash and gap in pixels. */
  readonly dash: LineDash;
}

/** Symbols and dashes in the order models receive them, beside their colours. */
export const seriesMarks: readonly SeriesMark[] = [
  { symbol: 'circle', dash: 'solid' },
  { symbol: 'rect', dash: [8, 4] },
  { symbol: 'triangle', dash: [2, 3] },
  { symbol: 'diamond', dash: [10, 3, 2, 3] },
  { symbol: 'emptyCircle', dash: [16, 4] },
  { symbol: 'emptyTriangle', dash: [10, 3, 2, 3, 2, 3] },
];

function cycle(k: number, n: number): number {
  return ((k % n) + n) % n;
}

/** The colour of the k-th model (cycling). */
export function seriesColour(k: number): string {
  return seriesColours[cycle(k, seriesColours.length)];
}

/** The symbol and dash of the k-th model (cycling). */
export function seriesMark(k: number): SeriesMark {
  const m = seriesMarks[cycle(k, seriesMarks.length)];
  return { symbol: m.symbol, dash: Array.isArray(m.dash) ? [...m.dash] : m.dash };
}
