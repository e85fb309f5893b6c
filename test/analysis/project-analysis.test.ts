import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { ProjectSession } from '../../src-main/services/project-session';
import { loadProject } from '../../src-main/project/project-store';
import { projectAnalysis } from '../../src-main/project/project-analysis';
import { cleanedAnalysisOf } from '@shared/analysis/cleaned-analysis';
import type { DataTable } from '@shared/data/table';
import { tempFolder } from '../project/temp-folder';

// The app's Models stage computes its table in the page from the records the
// import sent (readWorkbook) and the site-list cells it asks for; the command
// line computes it in Node from the saved project file (rebuildSource). Both
// must give the same table. (Demo data: invented.)

const folder = tempFolder('tw-analysis-');
afterAll(() => folder.remove());

function columns(t: DataTable): Record<string, string[]> {
  return Object.fromEntries(t.columns.map((c) => [c.name, [...c.texts]]));
}

describe('app and command line see the same analysis table', () => {
  it('on the demo with its recorded cleaning: the page path equals projectAnalysis of the saved file', async () => {
    const session = new ProjectSession(folder.dir);
    const opened = await session.newFromDemo(true);
    const link = opened.document.sites!;
    const fileName = opened.document.sources.find((s) => s.id === link.sourceId)!.fileName;
    const page = cleanedAnalysisOf(opened.sources, opened.document.cleaning, { link, grid: session.sheetCells(link.sourceId, link.sheet), fileName });

    const file = join(folder.dir, 'demo.tallywise');
    await session.save(file, opened.document);
    const { document } = await loadProject(file);
    const cli = await projectAnalysis(document);

    expect(page.siteProblems).toEqual([]);
    expect(page.analysis.table.nrows).toBeGreaterThan(2000);
    expect(columns(cli.table)).toEqual(columns(page.analysis.table));
    expect(cli.roles).toEqual(page.roles);
    expect(cli.dataKey).toBe(page.dataKey);
    expect(cli.cleaned.filter((r) => r.excluded).map((r) => r.id)).toEqual(page.cleaned.filter((r) => r.excluded).map((r) => r.id));
    expect(cli.sources).toHaveLength(15);
    expect(cli.sources[0]).toMatchObject({ name: 'quillbrook-call-survey-2012.xlsx', rows: opened.sources[0].summary.records });
    expect(cli.sources[0].sha256).toMatch(/^[0-9a-f]{64}$/);
  }, 60_000);

  it('without a site list the table has no area or habitat; a link to a missing sheet is reported, not fatal', async () => {
    const session = new ProjectSession(folder.dir);
    const opened = await session.newFromDemo(false);
    const file = join(folder.dir, 'raw.tallywise');
    await session.save(file, { ...opened.document, sites: null });
    const { document } = await loadProject(file);
    const plain = await projectAnalysis(document);
    expect(plain.table.columns.map((c) => c.name)).not.toContain('area_ha');
    expect(plain.roles.area).toBeNull();
    const gone = await projectAnalysis({ ...document, sites: { ...opened.document.sites!, sheet: 'Sites' } });
    expect(gone.siteProblems).toEqual([expect.stringMatching(/sheet "Sites" of quillbrook-call-survey-2026\.xlsx, which the project does not hold; link the site list again/)]);
    expect(gone.table.nrows).toBe(plain.table.nrows);
    expect(gone.dataKey).not.toBe(plain.dataKey);
  }, 60_000);
});
