import { describeEntry as describeWith, type EntryText } from '@shared/cleaning/describe-entry';
import type { EditEntry } from '@shared/cleaning/edit-entry';
import { describePlace } from '@shared/cleaning/place-words';
import type { RecordSet } from './record-set';

/** One log entry as the audit panel shows it, in the words the report uses too (src-shared/cleaning/describe-entry.ts). */
export { fieldNames, kindWords, showValue, statusWords, type EntryText } from '@shared/cleaning/describe-entry';

export function describeEntry(e: EditEntry, set: RecordSet, byId: ReadonlyMap<string, EditEntry>): EntryText {
  return describeWith(e, {
    record: (id) => set.rawById.get(id),
    place: (id) => {
      const p = set.places.get(id);
      return p ? describePlace(p) : undefined;
    },
    file: (id) => set.places.get(id)?.fileName,
    entry: (id) => byId.get(id),
  });
}
