/**
 * The charts as the report draws them (echarts' server-side SVG, through
 * renderChartSvg) opened in Chromium (the system browser through
 * playwright-core), where the text is drawn in a real font: no two pieces
 * of text overlap, every one lies inside the picture, the legend ends above
 * the vertical axis's name and that name above the plot. The text is set
 * in DejaVu Sans, as the PDF report sets it. Drawn at the
 * report's size and at the narrowest a chart gets on screen (560 px, see
 * .chart-grid in styles.css), with 1, 3 and 6 models on the frequency
 * chart. The PNGs land in test-output/charts/ to look at.
 * Data: MASS's quine fits (test/diagnostics/quine-reference.ts) and seeded
 * invented sites; the model labels are invented, as long as the app writes them.
 */
import { mkdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { browserPath, chromiumForFile } from '../report/chromium';
import { describe, expect, it } from 'vitest';
import { influenceChart, meanVarianceChart, residualsVsFittedChart, zerosChart, type ChartOption } from '@shared/charts';
import { chartLayout, USUAL_GRID_TOP } from '@shared/charts/chart-layout';
import { meanVarianceBySite, quantileResiduals, siteInfluenceOneStep, zeroCounts } from '@shared/diagnostics';
import { fitModel } from '@shared/engine';
import { parseModelSpec } from '@shared/model/spec';
import { frequenciesOf, labelledFits, LONG_LABELS } from './long-labels';
import { quineFit } from '../diagnostics/quine-reference';
import { simulateSites } from '../diagnostics/simulated-sites';
import { renderSvg } from './render-svg';

const outDir = resolve(__dirname, '../../test-output/charts');
const browser = chromiumForFile();



interface Box {
  text: string;
  left: number;
  top: number;
  right: number;
  bottom: number;
}

/** Every text of the SVG with the box Chromium draws it in. */
async function textBoxes(svg: string, width: number, height: number, png: string): Promise<Box[]> {
  const page = await browser().newPage({ viewport: { width, height } });
  try {
    // Set in DejaVu Sans, as the PDF report sets its charts (src-main/report/pdf.ts), the widest of the usual fonts.
    await page.setContent(`<!doctype html><html><head><style>body { margin: 0 } svg text { font-family: "DejaVu Sans" !important }</style></head><body>${svg}</body></html>`);
    mkdirSync(outDir, { recursive: true });
    await page.screenshot({ path: join(outDir, png) });
    return await page.evaluate(() =>
      [...document.querySelectorAll('svg text')].map((t) => {
        const r = t.getBoundingClientRect();
        return { text: t.textContent ?? '', left: r.left, top: r.top, right: r.right, bottom: r.bottom };
      }),
    );
  } finally {
    await page.close();
  }
}

function overlaps(a: Box, b: Box): boolean {
  // 2 px of slack: a text's box holds the space above and below its letters, so boxes of text that does not touch may.
  const slack = 2;
  return a.left < b.right - slack && b.left < a.right - slack && a.top < b.bottom - slack && b.top < a.bottom - slack;
}

async function check(name: string, option: ChartOption, width: number, height: number): Promise<void> {
  const boxes = (await textBoxes(renderSvg(option, width, height), width, height, `${name}-${width}.png`)).filter((b) => b.text.trim());
  const clashes: string[] = [];
  const where = (b: Box) => `"${b.text}" [${[b.left, b.top, b.right, b.bottom].map(Math.round).join(' ')}]`;
  boxes.forEach((a, i) => boxes.slice(i + 1).forEach((b) => overlaps(a, b) && clashes.push(`${where(a)} and ${where(b)}`)));
  expect(clashes, `${name} at ${width} px`).toEqual([]);
  for (const b of boxes) {
    expect(b.left, `"${b.text}" left`).toBeGreaterThanOrEqual(0);
    expect(b.top, `"${b.text}" top`).toBeGreaterThanOrEqual(0);
    expect(b.right, `"${b.text}" right`).toBeLessThanOrEqual(width);
    expect(b.bottom, `"${b.text}" bottom`).toBeLessThanOrEqual(height);
  }
  // Above the plot, in this order: the title block, the legend, the vertical axis's name.
  const at = chartLayout(option, width);
  const yName = String((option.yAxis as { name: string }).name);
  const nameBoxes = boxes.filter((b) => yName.includes(b.text.trim()) && b.top < at.gridTop);
  expect(nameBoxes.length, `${name}: the axis name is drawn above the plot`).toBeGreaterThan(0);
  for (const b of nameBoxes) expect(b.bottom, `${name}: axis name above the plot`).toBeLessThanOrEqual(at.gridTop);
  const legend = (option.legend as { show?: boolean }).show === false ? [] : boxes.filter((b) => b.top >= at.legendTop - 2 && b.bottom <= Math.min(...nameBoxes.map((n) => n.top)) + 0.5);
  if (at.legendRows) expect(legend.length, `${name}: legend texts between the title and the axis name`).toBeGreaterThan(0);
}

describe.skipIf(!browserPath)('chart layout in Chromium: nothing overlaps, nothing runs off', () => {
  for (const models of [1, 3, 6])
    it(`frequency chart with ${models} model${models > 1 ? 's' : ''}`, async () => {
      const o = frequenciesOf(models);
      await check(`frequencies-${models}`, o, 760, 440);
      // On screen a chart grows by the room its legend takes beyond the usual (components/EChart.tsx).
      await check(`frequencies-${models}`, o, 560, 340 + Math.max(0, chartLayout(o, 560).gridTop - USUAL_GRID_TOP));
    });

  it('zeros per model with six models (long names under narrow bars)', async () => {
    const fits = labelledFits(6).map((f) => ({ ...f, label: f.label.split(',')[0] }));
    const o = zerosChart(zeroCounts(fits));
    await check('zeros', o, 760, 440);
    await check('zeros', o, 560, 340);
  });

  it('residuals against fitted values (a long axis name)', async () => {
    const o = residualsVsFittedChart(quantileResiduals(quineFit('negbin'), { seed: 4 }), LONG_LABELS[1]);
    await check('residuals', o, 760, 440);
    await check('residuals', o, 560, 340);
  });

  it('influence by site (a subtitle of several lines) and mean against variance (a long legend)', async () => {
    const table = simulateSites(5, { sites: 12, seasons: 6, slope: -0.04, theta: 2, siteSd: 0.7, baseMean: 3 });
    const spec = parseModelSpec({ response: 'count', distribution: 'negbin', predictors: [{ column: 'season', type: 'numeric' }], offsets: [{ column: 'effort_h', log: true }] });
    const fit = fitModel(table, spec);
    const o = influenceChart(siteInfluenceOneStep(table, spec, fit, { coefficient: 'season', siteColumn: 'site' }), 'the trend per season');
    await check('influence', o, 760, 440);
    await check('influence', o, 560, 380);
    const mv = meanVarianceChart(meanVarianceBySite(table, fit, { siteColumn: 'site', effortColumn: 'effort_h' }), LONG_LABELS[1]);
    await check('mean-variance', mv, 760, 440);
    await check('mean-variance', mv, 560, 340);
  });
});
