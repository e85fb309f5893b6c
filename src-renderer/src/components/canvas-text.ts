import type { MeasureText } from '@shared/charts/text-width';
import { estimatedWidth } from '@shared/charts/text-width';

/**
 * Chart text measured as the screen draws it: with a canvas in the font
 * echarts uses for the charts ("sans-serif", see chart-style.ts), so the
 * room a chart leaves for its wrapped legend and titles matches what
 * echarts then draws. Without a canvas, the estimate of text-width.ts.
 */
let context: CanvasRenderingContext2D | null | undefined;

export const measureOnCanvas: MeasureText = (text, fontSize, bold) => {
  if (context === undefined) context = document.createElement('canvas').getContext('2d');
  if (!context) return estimatedWidth(text, fontSize, bold);
  context.font = `${bold ? 'bold ' : ''}${fontSize}px sans-serif`;
  return context.measureText(text).width;
};
