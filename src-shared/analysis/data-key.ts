import type { EditLog } from '../cleaning/edit-entry';
import type { SiteSheetLink } from '../project/site-sheet-link';
import { canonicalJson as canonical } from './canonical-json';

/**
 * A short key of the data the models see: the sources, every entry of the
 * change log and the site-list link. Results fitted under another key are
 * out of date. The text hashed has its object keys sorted, so the same log
 * gives the same key however it was built or read back (a file, the
 * bridge). FNV-1a over the text, with its length: a change detector, not a
 * checksum against tampering.
 */
export function dataKey(sourceIds: readonly string[], log: EditLog, sites: SiteSheetLink | null = null): string {
  const s = `${sourceIds.join(',')}|${canonical(log)}${sites ? `|${canonical(sites)}` : ''}`;
  let h = 0x811c9dc5;
  for (let i = 0; i < s.length; i++) {
    h ^= s.charCodeAt(i);
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return `${sourceIds.length}-${s.length}-${h.toString(16)}`;
}
