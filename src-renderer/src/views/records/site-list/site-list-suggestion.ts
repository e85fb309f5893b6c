import { useEffect, useState } from 'react';
import { looksLikeSiteList } from '@shared/analysis/site-list';
import { call } from '../../../host';
import type { SourceSheets } from './use-site-sheets';

/**
 * A kept sheet (not the records') that reads as a site list, with site
 * names and areas, to suggest linking while the project has no site list.
 * Each sheet is looked at once per list of sources.
 */
export interface SiteListSuggestion {
  readonly sourceId: string;
  readonly sheet: string;
  readonly fileName: string;
}

export function useSiteListSuggestion(sources: readonly SourceSheets[] | null, linked: boolean): SiteListSuggestion | null {
  const [found, setFound] = useState<{ of: readonly SourceSheets[]; suggestion: SiteListSuggestion | null } | null>(null);
  useEffect(() => {
    if (!sources || linked) return;
    let live = true;
    const candidates = sources.flatMap((s) => s.sheets.filter((g) => !g.records && g.rows > 1).map((g) => ({ sourceId: s.sourceId, sheet: g.name, fileName: s.fileName })));
    (async () => {
      for (const c of candidates) {
        const { grid } = await call('project:sheet-cells', { sourceId: c.sourceId, sheet: c.sheet });
        if (grid && looksLikeSiteList(grid)) return c;
      }
      return null;
    })()
      .then((suggestion) => live && setFound({ of: sources, suggestion }))
      .catch(() => live && setFound({ of: sources, suggestion: null }));
    return () => {
      live = false;
    };
  }, [sources, linked]);
  return !linked && found?.of === sources ? found.suggestion : null;
}
