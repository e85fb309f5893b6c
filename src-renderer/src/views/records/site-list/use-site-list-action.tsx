import { useMemo, useState, type ReactNode } from 'react';
import type { CleaningRecord } from '@shared/cleaning/record';
import type { SiteSheetLink } from '@shared/project/site-sheet-link';
import type { ProjectControls } from '../use-project';
import { SiteListDialog } from './SiteListDialog';
import { useSourceSheets } from './use-site-sheets';
import { useSiteListSuggestion, type SiteListSuggestion } from './site-list-suggestion';

/**
 * The Records stage's site-list action: the button, a banner suggesting a
 * sheet that looks like a site list, the dialog, and after linking a note
 * that says what changed with a way back to the link before.
 */
interface Linked {
  readonly text: string;
  readonly before: SiteSheetLink | null;
}

function sitesOf(records: readonly CleaningRecord[]): Map<string, number> {
  const out = new Map<string, number>();
  for (const r of records) {
    if (r.excluded !== undefined) continue;
    const site = r.fields['site'];
    const name = site === null || site === undefined ? '' : String(site).trim();
    if (name) out.set(name, (out.get(name) ?? 0) + 1);
  }
  return out;
}

export function useSiteListAction(controls: ProjectControls, records: readonly CleaningRecord[]): { button: ReactNode; banner: ReactNode; dialog: ReactNode } {
  const { project, setSites, edit } = controls;
  const refs = project?.document.sources;
  const current = project?.document.sites ?? null;
  const sources = useSourceSheets(useMemo(() => refs ?? [], [refs]));
  const suggestion = useSiteListSuggestion(sources, !!current);
  const [open, setOpen] = useState<{ suggested: SiteListSuggestion | null } | null>(null);
  const [linked, setLinked] = useState<Linked | null>(null);
  const recordSites = useMemo(() => sitesOf(records), [records]);

  const button = (
    <button type="button" className="button" disabled={!sources?.length} onClick={() => setOpen({ suggested: null })} title="Link a sheet that lists the sites with their areas and attributes">
      {current ? `Site list: ${current.sheet}…` : 'Site list…'}
    </button>
  );
  const undo = linked && (
    <button
      type="button"
      className="button is-small"
      onClick={() => {
        setSites(linked.before);
        setLinked(null);
      }}
    >
      Undo
    </button>
  );
  const banner = linked ? (
    <div className="banner" role="status" data-testid="site-list-linked">
      <span>{linked.text}</span>
      <span className="banner-actions">
        {undo}
        <button type="button" className="button is-quiet is-small" onClick={() => setLinked(null)}>
          Dismiss
        </button>
      </span>
    </div>
  ) : suggestion ? (
    <div className="banner" role="status" data-testid="site-list-suggestion">
      <span>
        Sheet “{suggestion.sheet}” of {suggestion.fileName} looks like a site list (site names with their areas). Link it to use the areas as an offset and its columns as site attributes.
      </span>
      <button type="button" className="button" onClick={() => setOpen({ suggested: suggestion })}>
        Link it…
      </button>
    </div>
  ) : null;

  const done = (link: SiteSheetLink | null | 'unlink') => {
    setOpen(null);
    if (link === null) return;
    const before = current;
    if (link === 'unlink') {
      setSites(null);
      setLinked({ text: 'The site list is unlinked: the analysis table has no area and no site attributes now.', before });
      return;
    }
    setSites(link);
    const parts = [link.area ? `area from “${link.area.column}” (${link.area.unit})` : 'no area', link.covariates.length ? `attributes ${link.covariates.map((c) => `“${c}”`).join(', ')}` : 'no attributes'];
    setLinked({ text: `Site list linked: sheet “${link.sheet}”, sites from “${link.siteColumn}”, ${parts.join(', ')}. The Models stage now offers ${link.area ? 'the area offset' : ''}${link.area && link.covariates.length ? ' and ' : ''}${link.covariates.length ? 'the site attributes as predictors' : ''}${!link.area && !link.covariates.length ? 'nothing new' : ''}.`, before });
  };

  const dialog =
    open && sources?.length ? (
      <SiteListDialog
        sources={sources}
        current={current}
        suggested={open.suggested}
        recordSites={recordSites}
        onMerge={(from, into) => edit({ kind: 'merge-name', field: 'site', from, into, reason: `Site name as the site list writes it` })}
        onDone={done}
      />
    ) : null;
  return { button, banner, dialog };
}
