/**
 * How wide a line of chart text is, and how many lines it takes when
 * wrapped at a width, so a chart's option can leave room for its title,
 * legend and axis names before echarts draws it. Without a canvas (the
 * report's server-side SVG, the builders) the width comes from the advance
 * widths of DejaVu Sans, the font the PDF report embeds and a wide one
 * among the fonts "sans-serif" falls to, so text set in a narrower font only
 * leaves a little room to spare. The screen passes its own measure.
 */

/** Width in px of `text` on one line at `fontSize` px. */
export type MeasureText = (text: string, fontSize: number, bold: boolean) => number;

// Advance widths in ems of the printable ASCII characters (space to "~") in
// DejaVu Sans and DejaVu Sans Bold, measured with a 100 px canvas in Chromium.
const REGULAR = [
  0.32, 0.4, 0.46, 0.84, 0.64, 0.95, 0.78, 0.27, 0.39, 0.39, 0.5, 0.84, 0.32, 0.36, 0.32, 0.34, 0.64, 0.64, 0.64, 0.64, 0.64, 0.64, 0.64, 0.64, 0.64, 0.64, 0.34, 0.34, 0.84, 0.84, 0.84, 0.53, 1, 0.68, 0.69, 0.7,
  0.77, 0.63, 0.58, 0.77, 0.75, 0.29, 0.29, 0.66, 0.56, 0.86, 0.75, 0.79, 0.6, 0.79, 0.69, 0.63, 0.61, 0.73, 0.68, 0.99, 0.69, 0.61, 0.69, 0.39, 0.34, 0.39, 0.84, 0.5, 0.5, 0.61, 0.63, 0.55, 0.63, 0.62, 0.35,
  0.63, 0.63, 0.28, 0.28, 0.58, 0.28, 0.97, 0.63, 0.61, 0.63, 0.63, 0.41, 0.52, 0.39, 0.63, 0.59, 0.82, 0.59, 0.59, 0.52, 0.64, 0.34, 0.64, 0.84,
];
const BOLD = [
  0.35, 0.46, 0.52, 0.84, 0.7, 1, 0.87, 0.31, 0.46, 0.46, 0.52, 0.84, 0.38, 0.42, 0.38, 0.37, 0.7, 0.7, 0.7, 0.7, 0.7, 0.7, 0.7, 0.7, 0.7, 0.7, 0.4, 0.4, 0.84, 0.84, 0.84, 0.58, 1, 0.77, 0.76, 0.73, 0.83, 0.68,
  0.68, 0.82, 0.84, 0.37, 0.37, 0.77, 0.64, 1, 0.84, 0.85, 0.73, 0.85, 0.77, 0.72, 0.68, 0.81, 0.77, 1.1, 0.77, 0.72, 0.73, 0.46, 0.37, 0.46, 0.84, 0.5, 0.5, 0.67, 0.72, 0.59, 0.72, 0.68, 0.44, 0.72, 0.71, 0.34,
  0.34, 0.67, 0.34, 1.04, 0.71, 0.69, 0.72, 0.72, 0.49, 0.6, 0.48, 0.71, 0.65, 0.92, 0.65, 0.65, 0.58, 0.71, 0.37, 0.71, 0.84,
];
/** Letters and signs outside ASCII (accented names, ², ±): about as wide as the widest lower-case letters. */
const OTHER_EM = 0.8;

/** The estimate: DejaVu Sans widths per character. */
export const estimatedWidth: MeasureText = (text, fontSize, bold) => {
  const table = bold ? BOLD : REGULAR;
  let em = 0;
  for (const ch of text) {
    const code = ch.codePointAt(0)! - 32;
    em += code >= 0 && code < table.length ? table[code] : OTHER_EM;
  }
  return em * fontSize;
};

/**
 * The estimate in the shape of echarts' `measureText` platform hook (a CSS
 * font such as "bold 15px sans-serif"), for the server-side renderer,
 * which otherwise measures with widths of a narrower font than the report sets.
 */
export function measureCssFont(text: string, font: string): { width: number } {
  const size = Number(/(\d+(?:\.\d+)?)px/.exec(font)?.[1] ?? 12);
  return { width: estimatedWidth(text, size, /\b(bold|bolder|[6-9]00)\b/.test(font)) };
}

/**
 * Lines `text` takes when broken between words to fit `width` px, as
 * echarts' `overflow: 'break'` does (a word longer than the line takes
 * lines of its own); a newline always starts a line. Empty text takes none.
 */
export function wrappedLines(text: string, width: number, fontSize: number, bold = false, measure: MeasureText = estimatedWidth): number {
  if (!text.trim()) return 0;
  const space = measure(' ', fontSize, bold);
  let lines = 0;
  for (const paragraph of text.split('\n')) {
    let used = 0;
    lines++;
    for (const word of paragraph.split(' ').filter(Boolean)) {
      const w = measure(word, fontSize, bold);
      if (used > 0 && used + space + w > width) {
        lines++;
        used = 0;
      }
      if (used === 0 && w > width) {
        // A word wider than the line is cut across lines.
        lines += Math.ceil(w / width) - 1;
        used = w % width;
      } else used += (used > 0 ? space : 0) + w;
    }
  }
  return lines;
}
