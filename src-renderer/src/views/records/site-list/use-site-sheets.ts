import { useEffect, useState } from 'react';
import type { ChannelOutput } from '@shared/host/contract';
import type { SheetGrid } from '@shared/project/sheet-grid';
import { call } from '../../../host';

/**
 * The sheets the project keeps of each source (the page holds no cells: the
 * host is asked), and the cells of one chosen sheet. Sheets the records were
 * not read from are the candidates for a site list.
 */
export type KeptSheet = ChannelOutput<'project:source-sheets'>['sheets'][number];

export interface SourceSheets {
  readonly sourceId: string;
  readonly fileName: string;
  readonly sheets: readonly KeptSheet[];
}

export function useSourceSheets(sources: readonly { id: string; fileName: string }[]): SourceSheets[] | null {
  const [got, setGot] = useState<{ of: typeof sources; list: SourceSheets[] } | null>(null);
  useEffect(() => {
    let live = true;
    Promise.all(sources.map(async (s) => ({ sourceId: s.id, fileName: s.fileName, sheets: (await call('project:source-sheets', { sourceId: s.id })).sheets })))
      .then((list) => live && setGot({ of: sources, list }))
      .catch(() => live && setGot({ of: sources, list: sources.map((s) => ({ sourceId: s.id, fileName: s.fileName, sheets: [] })) }));
    return () => {
      live = false;
    };
  }, [sources]);
  return got?.of === sources ? got.list : null;
}

export type SheetCells = { state: 'none' } | { state: 'loading' } | { state: 'ready'; grid: SheetGrid } | { state: 'missing' };

/** The stored cells of a source's sheet, fetched when the choice changes. */
export function useSheetCells(sourceId: string, sheet: string): SheetCells {
  const [got, setGot] = useState<{ key: string; cells: SheetCells } | null>(null);
  const key = `${sourceId}\u0000${sheet}`;
  useEffect(() => {
    if (!sourceId || !sheet) return;
    let live = true;
    call('project:sheet-cells', { sourceId, sheet })
      .then(({ grid }) => live && setGot({ key, cells: grid ? { state: 'ready', grid } : { state: 'missing' } }))
      .catch(() => live && setGot({ key, cells: { state: 'missing' } }));
    return () => {
      live = false;
    };
  }, [sourceId, sheet, key]);
  if (!sourceId || !sheet) return { state: 'none' };
  return got?.key === key ? got.cells : { state: 'loading' };
}
