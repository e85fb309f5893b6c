import type { Locator, Page } from 'playwright-core';

/**
 * Reads a drawn echarts chart in the page through the instance the chart box
 * holds (src-renderer/src/components/EChart.tsx): its series as echarts keeps
 * them, and the screen position of a data point, so a test can click it.
 */
export interface SeriesSeen {
  id: string;
  name: string;
  type: string;
  data: unknown[];
}

type Box = HTMLElement & { echartsInstance?: { getOption(): { series?: { id?: string; name?: string; type?: string; data?: unknown[] }[] }; convertToPixel(finder: object, value: unknown): number[] } };

export function chartBox(page: Page, id: string): Locator {
  return page.getByTestId(`chart-${id}`).locator('.chart-box');
}

export async function seriesOf(page: Page, id: string): Promise<SeriesSeen[]> {
  const box = chartBox(page, id);
  await box.locator('canvas').first().waitFor({ timeout: 120_000 });
  return box.evaluate((el) => {
    const chart = (el as Box).echartsInstance;
    if (!chart) throw new Error('no echarts instance on the chart box');
    return (chart.getOption().series ?? []).map((s) => ({ id: String(s.id ?? ''), name: String(s.name ?? ''), type: String(s.type ?? ''), data: s.data ?? [] }));
  });
}

/** Clicks the chart at a value of one series (e.g. a point's [x, y], or [category index, bar value]). */
export async function clickAt(page: Page, id: string, seriesId: string, value: unknown): Promise<void> {
  const box = chartBox(page, id);
  await box.scrollIntoViewIfNeeded();
  const [x, y] = await box.evaluate((el, a) => (el as Box).echartsInstance!.convertToPixel({ seriesId: a.seriesId }, a.value), { seriesId, value });
  const rect = await box.boundingBox();
  if (!rect) throw new Error(`chart ${id} is not on screen`);
  await page.mouse.click(rect.x + x, rect.y + y);
}

/** The category labels of a chart's x axis. */
export async function categoriesOf(page: Page, id: string): Promise<string[]> {
  return chartBox(page, id).evaluate((el) => {
    const o = (el as Box).echartsInstance!.getOption() as { xAxis?: { data?: unknown[] }[] };
    return (o.xAxis?.[0]?.data ?? []).map(String);
  });
}
