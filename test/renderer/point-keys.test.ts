/**
 * Choosing a chart point from the keyboard (src-renderer/src/components/
 * point-keys.ts and chart-points.ts): which points of an option can be
 * reached, and where each key moves. The points are small invented sets
 * whose orders can be read off by eye.
 */
import { describe, expect, it } from 'vitest';
import type { EChartsOption } from 'echarts';
import { chartPoints } from '../../src-renderer/src/components/chart-points';
import { nextPoint, pointKeys, pointOrder } from '../../src-renderer/src/components/point-keys';
import { influenceChart, residualsByGroupChart } from '@shared/charts';
import { quantileResiduals, residualGroups, siteInfluenceOneStep } from '@shared/diagnostics';
import { fitModel } from '@shared/engine';
import { parseModelSpec } from '@shared/model/spec';
import { quineFit, quineTable } from '../diagnostics/quine-reference';
import { simulateSites } from '../diagnostics/simulated-sites';

// Five invented points: along x they come 0, 2, 1, 3, 4; by value 2, 0, 4, 1, 3.
const pts = [
  { x: 1, y: 0.5 }, // 0
  { x: 3, y: 2 }, // 1
  { x: 2, y: -1 }, // 2
  { x: 4, y: 3 }, // 3
  { x: 5, y: 1 }, // 4
];
const order = pointOrder(pts);

/** Where a run of keys ends, from no point chosen. */
function walk(keys: string[], from: number | null = null): (number | undefined)[] {
  const seen: (number | undefined)[] = [];
  let at = from;
  for (const k of keys) {
    const next = nextPoint(k, at, order);
    seen.push(next);
    if (next !== undefined) at = next;
  }
  return seen;
}

describe('the order of the points', () => {
  it('by x then y, and by y then x, with each point\'s place in both', () => {
    expect(order.byX).toEqual([0, 2, 1, 3, 4]);
    expect(order.byY).toEqual([2, 0, 4, 1, 3]);
    order.byX.forEach((p, k) => expect(order.rankX[p]).toBe(k));
    order.byY.forEach((p, k) => expect(order.rankY[p]).toBe(k));
  });
  it('ties on x are broken by y, then by the series order', () => {
    const o = pointOrder([{ x: 1, y: 5 }, { x: 1, y: -2 }, { x: 0, y: 9 }, { x: 1, y: -2 }]);
    expect(o.byX).toEqual([2, 1, 3, 0]);
    expect(o.byY).toEqual([1, 3, 0, 2]);
  });
});

describe('keys from no point chosen', () => {
  it('Right and Home start at the left, Left and End at the right, Up at the top, Down at the bottom', () => {
    expect(nextPoint('ArrowRight', null, order)).toBe(0);
    expect(nextPoint('Home', null, order)).toBe(0);
    expect(nextPoint('ArrowLeft', null, order)).toBe(4);
    expect(nextPoint('End', null, order)).toBe(4);
    expect(nextPoint('ArrowUp', null, order)).toBe(3);
    expect(nextPoint('PageUp', null, order)).toBe(3);
    expect(nextPoint('ArrowDown', null, order)).toBe(2);
    expect(nextPoint('PageDown', null, order)).toBe(2);
  });
  it('an index out of range counts as none chosen', () => {
    expect(nextPoint('ArrowRight', 17, order)).toBe(0);
    expect(nextPoint('ArrowRight', -1, order)).toBe(0);
  });
});

describe('moving', () => {
  it('Right walks along x and stops at the last point', () => {
    expect(walk(['ArrowRight', 'ArrowRight', 'ArrowRight', 'ArrowRight', 'ArrowRight', 'ArrowRight'])).toEqual([0, 2, 1, 3, 4, 4]);
  });
  it('Left walks back and stops at the first point', () => {
    expect(walk(['ArrowLeft', 'ArrowLeft', 'ArrowLeft', 'ArrowLeft', 'ArrowLeft', 'ArrowLeft'])).toEqual([4, 3, 1, 2, 0, 0]);
  });
  it('Up climbs by value from wherever the point is along x; Down comes back', () => {
    // From point 0 (y 0.5): the next higher values are 1 (point 4), 2 (point 1), 3 (point 3).
    expect(walk(['ArrowUp', 'ArrowUp', 'ArrowUp', 'ArrowUp'], 0)).toEqual([4, 1, 3, 3]);
    expect(walk(['ArrowDown', 'ArrowDown', 'ArrowDown'], 4)).toEqual([0, 2, 2]);
  });
  it('Right then Left comes back to the same point, from anywhere', () => {
    for (let p = 0; p < pts.length; p++) {
      const right = nextPoint('ArrowRight', p, order)!;
      if (right !== p) expect(nextPoint('ArrowLeft', right, order)).toBe(p);
    }
  });
  it('other keys do not move, and a chart without points has nowhere to go', () => {
    expect(nextPoint('Enter', 1, order)).toBeUndefined();
    expect(nextPoint('a', null, order)).toBeUndefined();
    expect(nextPoint('Tab', 2, order)).toBeUndefined();
    expect(pointKeys.has('Enter')).toBe(false);
    expect(nextPoint('ArrowRight', null, pointOrder([]))).toBeUndefined();
  });
});

describe('the points of a chart option', () => {
  it('[x, y, row] points of the named series only, with their series and data index', () => {
    const option: EChartsOption = {
      xAxis: { type: 'value' },
      series: [
        { id: 'band', type: 'line', data: [[0, 1], [1, 2]] },
        { id: 'inside', type: 'scatter', data: [[0.5, -1, 7], [1.5, null, 8], [2.5, 2, 9]] },
        { id: 'outside', type: 'scatter', data: [[3, 4, 1]] },
      ],
    };
    const p = chartPoints(option, ['inside', 'outside']);
    expect(p.map((q) => [q.seriesId, q.seriesIndex, q.dataIndex, q.x, q.y])).toEqual([
      ['inside', 1, 0, 0.5, -1],
      ['inside', 1, 2, 2.5, 2],
      ['outside', 2, 0, 3, 4],
    ]);
    // The item is handed on as the option holds it (a click gets the same).
    expect(p[1].data).toEqual([2.5, 2, 9]);
  });
  it('points at a category by name sit at the category index (residuals by a column)', () => {
    const res = quantileResiduals(quineFit('negbin'), { seed: 4 });
    const groups = residualGroups(res, quineTable(), 'Age');
    const o = residualsByGroupChart(res, groups, 'Negative binomial');
    const p = chartPoints(o, ['residuals']);
    expect(p).toHaveLength(146);
    p.forEach((q, i) => {
      expect(q.x).toBe(groups.levelOf[i]);
      expect(q.category).toBe(groups.levels[groups.levelOf[i]]);
      expect((q.data as number[])[2]).toBe(res.rows[i]);
    });
    // Up from nothing finds the largest residual of the chart.
    const top = nextPoint('ArrowUp', null, pointOrder(p))!;
    expect(p[top].y).toBe(Math.max(...p.map((q) => q.y)));
  });
  it('bars { value } sit at their index; a site without a value is left out (influence by site)', () => {
    const table = simulateSites(5, { sites: 12, seasons: 6, slope: -0.04, theta: 2, siteSd: 0.7, baseMean: 3 });
    const spec = parseModelSpec({ response: 'count', distribution: 'negbin', predictors: [{ column: 'season', type: 'numeric' }], offsets: [{ column: 'effort_h', log: true }] });
    const infl = siteInfluenceOneStep(table, spec, fitModel(table, spec), { coefficient: 'season', siteColumn: 'site' });
    const o = influenceChart(infl);
    const p = chartPoints(o, ['change']);
    const withValue = infl.sites.filter((s) => s.change !== null);
    expect(p).toHaveLength(withValue.length);
    expect(p.map((q) => q.category)).toEqual(withValue.map((s) => s.site));
    expect(p.map((q) => q.x)).toEqual(withValue.map((s) => infl.sites.indexOf(s)));
    const cut = { ...o, series: [{ id: 'change', type: 'bar', data: [{ value: 1 }, { value: null }, 3] }], xAxis: { type: 'category', data: ['A', 'B', 'C'] } } as EChartsOption;
    expect(chartPoints(cut, ['change']).map((q) => [q.category, q.x, q.y])).toEqual([
      ['A', 0, 1],
      ['C', 2, 3],
    ]);
  });
});
