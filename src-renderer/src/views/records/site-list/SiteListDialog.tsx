import { useEffect, useMemo, useState } from 'react';
import { DialogForm } from '../../../components/DialogForm';
import { checkSiteList, guessSiteList, headerRowProblem, headersAt } from '@shared/analysis/site-list';
import { areaUnits, type AreaUnit } from '@shared/import/units';
import type { SiteSheetLink } from '@shared/project/site-sheet-link';
import { useSheetCells, type SourceSheets } from './use-site-sheets';
import { SiteListPreview } from './SiteListPreview';

/**
 * Links a sheet of an imported workbook as the programme's site list: which
 * sheet, the header row, the site-name column, the area column and its unit,
 * the columns to carry as site attributes. A preview checks the list against
 * the records' sites before anything is saved.
 */
const unitNames: Record<AreaUnit, string> = { m2: 'm² (square metres)', ha: 'ha (hectares)', km2: 'km² (square kilometres)' };

interface Choice {
  sourceId: string;
  sheet: string;
}

/** The sheet to start on: the current link's, else the first kept sheet the records were not read from. */
function firstChoice(sources: readonly SourceSheets[], current: SiteSheetLink | null, suggested: Choice | null): Choice {
  if (current) return { sourceId: current.sourceId, sheet: current.sheet };
  if (suggested) return suggested;
  for (const s of sources) {
    const other = s.sheets.find((g) => !g.records);
    if (other) return { sourceId: s.sourceId, sheet: other.name };
  }
  const s = sources[0];
  return { sourceId: s?.sourceId ?? '', sheet: s?.sheets[0]?.name ?? '' };
}

export function SiteListDialog({
  sources,
  current,
  suggested,
  recordSites,
  onMerge,
  onDone,
}: {
  sources: readonly SourceSheets[];
  current: SiteSheetLink | null;
  suggested: Choice | null;
  recordSites: ReadonlyMap<string, number>;
  onMerge(from: string, into: string): void;
  onDone(link: SiteSheetLink | null | 'unlink'): void;
}) {
  const [choice, setChoice] = useState<Choice>(() => firstChoice(sources, current, suggested));
  const [headerRow, setHeaderRow] = useState(current?.headerRow ?? 1);
  const [siteColumn, setSiteColumn] = useState(current?.siteColumn ?? '');
  const [areaColumn, setAreaColumn] = useState(current?.area?.column ?? '');
  const [unit, setUnit] = useState<AreaUnit>(current?.area?.unit ?? 'ha');
  const [covariates, setCovariates] = useState<string[]>(current ? [...current.covariates] : []);
  const cells = useSheetCells(choice.sourceId, choice.sheet);
  const grid = cells.state === 'ready' ? cells.grid : null;
  const source = sources.find((s) => s.sourceId === choice.sourceId);

  // A newly chosen sheet starts from a guess at its header row and columns (the current link's sheet keeps the link's choices).
  const [guessedFor, setGuessedFor] = useState(current ? `${current.sourceId}\u0000${current.sheet}` : '');
  useEffect(() => {
    const key = `${choice.sourceId}\u0000${choice.sheet}`;
    if (!grid || guessedFor === key) return;
    setGuessedFor(key);
    const guess = guessSiteList(grid);
    setHeaderRow(guess?.headerRow ?? 1);
    setSiteColumn(guess?.siteColumn ?? '');
    setAreaColumn(guess?.area?.column ?? '');
    setUnit(guess?.area?.unit ?? 'ha');
    setCovariates([]);
  }, [grid, choice, guessedFor]);

  const headers = useMemo(() => (grid ? headersAt(grid, headerRow).filter(Boolean) : []), [grid, headerRow]);
  const link: SiteSheetLink | null = siteColumn
    ? { sourceId: choice.sourceId, sheet: choice.sheet, headerRow, siteColumn, area: areaColumn ? { column: areaColumn, unit } : null, covariates: covariates.filter((c) => c !== siteColumn && c !== areaColumn) }
    : null;
  const check = useMemo(() => (grid && link ? checkSiteList(grid, link, source?.fileName ?? '', recordSites) : null), [grid, JSON.stringify(link), recordSites, source?.fileName]);
  const usable = !!check && !check.unusable;
  const others = headers.filter((h) => h !== siteColumn && h !== areaColumn);

  return (
    <DialogForm id="site-list-title" title="Site list: areas and attributes of the sites" wide onSubmit={() => usable && onDone(link)} onCancel={() => onDone(null)}>
      <p>
        Link a sheet that lists each site once, with its area and attributes (habitat, altitude…). Each record’s site is matched to the list by its name; the area becomes the
        area offset and the other columns become site predictors on the Models stage.
      </p>
      <div className="field-row">
        <label className="field">
          <span>Sheet</span>
          <select
            aria-label="Sheet"
            value={`${choice.sourceId}\u0000${choice.sheet}`}
            onChange={(e) => {
              const [sourceId, sheet] = e.target.value.split('\u0000');
              setChoice({ sourceId, sheet });
            }}
          >
            {sources.flatMap((s) =>
              s.sheets.map((g) => (
                <option key={`${s.sourceId}/${g.name}`} value={`${s.sourceId}\u0000${g.name}`}>
                  {g.name} — {s.fileName} ({g.rows} rows{g.records ? ', the records’ sheet' : ''})
                </option>
              )),
            )}
          </select>
        </label>
        <label className="field site-list-row">
          <span>Header row</span>
          <input type="number" min={1} max={grid?.rows ?? 1} value={headerRow} aria-label="Header row" onChange={(e) => setHeaderRow(Math.max(1, Math.floor(Number(e.target.value) || 1)))} />
        </label>
      </div>
      {cells.state === 'loading' && <p className="status">Reading the sheet…</p>}
      {cells.state === 'missing' && (
        <div className="problem" role="alert">
          The project does not hold the cells of this sheet. Import the workbook again (its other sheets are kept since this version), then link it.
        </div>
      )}
      {grid && (
        <>
          <div className="field-row">
            <label className="field">
              <span>Site names</span>
              <select aria-label="Site name column" value={siteColumn} onChange={(e) => setSiteColumn(e.target.value)}>
                <option value="">Choose the column…</option>
                {headers.map((h) => (
                  <option key={h}>{h}</option>
                ))}
              </select>
            </label>
            <label className="field">
              <span>Area</span>
              <select aria-label="Area column" value={areaColumn} onChange={(e) => setAreaColumn(e.target.value)}>
                <option value="">No area column</option>
                {headers.filter((h) => h !== siteColumn).map((h) => (
                  <option key={h}>{h}</option>
                ))}
              </select>
            </label>
            <label className="field">
              <span>Area unit</span>
              <select aria-label="Area unit" value={unit} disabled={!areaColumn} onChange={(e) => setUnit(e.target.value as AreaUnit)}>
                {areaUnits.map((u) => (
                  <option key={u} value={u}>
                    {unitNames[u]}
                  </option>
                ))}
              </select>
            </label>
          </div>
          {others.length > 0 && (
            <fieldset className="site-list-covariates">
              <legend>Site attributes to carry into the analysis</legend>
              <div className="check-list">
                {others.map((h) => (
                  <label key={h} className="check">
                    <input type="checkbox" checked={covariates.includes(h)} onChange={(e) => setCovariates((c) => (e.target.checked ? [...c, h] : c.filter((x) => x !== h)))} />
                    {h}
                  </label>
                ))}
              </div>
            </fieldset>
          )}
          {!siteColumn && headerRowProblem(grid, headerRow) && (
            <div className="problem" role="alert" data-testid="site-list-problem">
              {headerRowProblem(grid, headerRow)}
            </div>
          )}
          {!siteColumn && !headerRowProblem(grid, headerRow) && <p className="hint">Choose the column that holds the site names.</p>}
          {check && <SiteListPreview check={check} onMerge={onMerge} />}
          {areaColumn && (
            <p className="hint">
              Areas are converted to hectares for the analysis table (area_ha); the offset is their natural log. An area offset assumes counts grow in proportion to the site’s area; with a
              fixed effect per site it leaves the trend unchanged. Check this against the programme’s protocol, and have a statistician review the choice.
            </p>
          )}
        </>
      )}
      <div className="dialog-actions">
        {current && (
          <button type="button" className="button is-quiet" onClick={() => onDone('unlink')}>
            Unlink the site list
          </button>
        )}
        <button type="button" className="button" onClick={() => onDone(null)}>
          Cancel
        </button>
        <button type="submit" className="button is-primary" disabled={!usable}>
          Use this site list
        </button>
      </div>
    </DialogForm>
  );
}
