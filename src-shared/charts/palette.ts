/**
 * Tallywise's colours: a colour-blind-safe set based on the eight colours of
 * Okabe, M. & Ito, K. (2008), "Color Universal Design (CUD): how to make
 * figures and presentations that are friendly to colorblind people"
 * (J*Fly, jfly.uni-koeln.de/color/), in our own order, with our own greys
 * for observed data, ink and grid. Models take the series colours in turn;
 * observed data are always grey, so "what was counted" never looks like a model.
 */

/** Series colours in the order models receive them. */
export const seriesColours = [
  '#0072B2', // blue
  '#D55E00', // vermillion
  '#009E73', // bluish green
  '#CC79A7', // reddish purple
  '#E69F00', // orange
  '#56B4E9', // sky blue
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
} as const;

/** Points or bars that call for a look (outside an envelope, flagged). */
export const attention = '#D55E00';

/** The colour of the k-th model (cycling). */
export function seriesColour(k: number): string {
  return seriesColours[((k % seriesColours.length) + seriesColours.length) % seriesColours.length];
}
