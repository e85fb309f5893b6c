import { useEffect, useState } from 'react';
import type { SiteSheet } from '@shared/analysis/cleaned-analysis';
import type { SiteSheetLink } from '@shared/project/site-sheet-link';
import type { SheetGrid } from '@shared/project/sheet-grid';
import type { OpenProject } from '../records/use-project';
import { call } from '../../host';

/**
 * The project's site list (doc.sites) with its cells, fetched from the host
 * (the page holds no sheet cells) whenever the link changes. Null while
 * there is no link; a link whose cells the host does not hold gives a null
 * grid, which the analysis reports as a problem. `loading` while asking.
 */
export function useSiteSheet(project: OpenProject | null): { sheet: SiteSheet | null; loading: boolean } {
  const link = project?.document.sites ?? null;
  const fileName = link ? (project?.document.sources.find((s) => s.id === link.sourceId)?.fileName ?? `source ${link.sourceId}`) : '';
  const [got, setGot] = useState<{ link: SiteSheetLink; grid: SheetGrid | null; fileName: string } | null>(null);
  useEffect(() => {
    if (!link) return;
    let live = true;
    call('project:sheet-cells', { sourceId: link.sourceId, sheet: link.sheet })
      .then(({ grid }) => live && setGot({ link, grid, fileName }))
      .catch(() => live && setGot({ link, grid: null, fileName }));
    return () => {
      live = false;
    };
  }, [link, fileName]);
  if (!link) return { sheet: null, loading: false };
  return got?.link === link ? { sheet: got, loading: false } : { sheet: null, loading: true };
}
