import type { ChartPoint } from './chart-points';

/**
 * Moving between the points of a chart from the keyboard: Left and Right
 * go to the previous and next point along the x axis, Up and Down to the
 * next point above or below in value (over the whole chart, so Up from the
 * top residual stays there), Home and End to the first and last along x,
 * Page Up and Page Down to the highest and lowest. With no point chosen,
 * Right and Home start at the first point along x, Left and End at the
 * last, Up at the highest and Down at the lowest. Ties keep the other
 * axis's order, then the series' order, so every move is repeatable.
 */
export interface PointOrder {
  /** Point indices by x (then y). */
  readonly byX: readonly number[];
  /** Point indices by y (then x). */
  readonly byY: readonly number[];
  /** Position of each point in byX and in byY. */
  readonly rankX: readonly number[];
  readonly rankY: readonly number[];
}

type Pos = Pick<ChartPoint, 'x' | 'y'>;

function ranks(order: readonly number[]): number[] {
  const r = new Array<number>(order.length);
  order.forEach((p, k) => (r[p] = k));
  return r;
}

export function pointOrder(points: readonly Pos[]): PointOrder {
  const idx = points.map((_, i) => i);
  const byX = [...idx].sort((a, b) => points[a].x - points[b].x || points[a].y - points[b].y || a - b);
  const byY = [...idx].sort((a, b) => points[a].y - points[b].y || points[a].x - points[b].x || a - b);
  return { byX, byY, rankX: ranks(byX), rankY: ranks(byY) };
}

export const pointKeys: ReadonlySet<string> = new Set(['ArrowLeft', 'ArrowRight', 'ArrowUp', 'ArrowDown', 'Home', 'End', 'PageUp', 'PageDown']);

/** The point a key moves to from `current` (null: none chosen yet); undefined for a key that does not move. */
export function nextPoint(key: string, current: number | null, order: PointOrder): number | undefined {
  const n = order.byX.length;
  if (!pointKeys.has(key) || n === 0) return undefined;
  const clamp = (k: number) => Math.min(n - 1, Math.max(0, k));
  const at = current !== null && current >= 0 && current < n ? current : null;
  switch (key) {
    case 'Home':
      return order.byX[0];
    case 'End':
      return order.byX[n - 1];
    case 'PageUp':
      return order.byY[n - 1];
    case 'PageDown':
      return order.byY[0];
    case 'ArrowRight':
      return at === null ? order.byX[0] : order.byX[clamp(order.rankX[at] + 1)];
    case 'ArrowLeft':
      return at === null ? order.byX[n - 1] : order.byX[clamp(order.rankX[at] - 1)];
    case 'ArrowUp':
      return at === null ? order.byY[n - 1] : order.byY[clamp(order.rankY[at] + 1)];
    default:
      return at === null ? order.byY[0] : order.byY[clamp(order.rankY[at] - 1)];
  }
}
