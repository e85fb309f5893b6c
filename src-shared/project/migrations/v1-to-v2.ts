import { z } from 'zod';
import type { Migration } from '../migrations';

/**
 * Version 1: models were `{ id, name, chosen, spec }` with no species (the
 * app did not fill them yet), and there was no link to a sheet of site
 * attributes.
 *
 * To version 2: each model gets the species it belongs to and
 * `dropBadOffsetRows: false`. A version-1 model named no species, so it
 * becomes one model per species the report lists (`report.species`), ids
 * `<id>` for the first and `<id>-2`, `<id>-3` ... for the others, each
 * keeping `chosen`; with no report species it keeps its id with species ''
 * (not said). At most one model per species may be chosen in version 2, so
 * of several chosen models of a species only the first listed stays chosen.
 * Fit-cache entries are dropped (they name version-1 model ids and only tell
 * whether a result is current; the app fits again). `sites` starts as null.
 * Every other member is carried over unchanged (the version-1 schema checks
 * the members this step reads, and passes the rest through).
 */
const v1Schema = z
  .object({
    formatVersion: z.literal(1),
    models: z.array(z.object({ id: z.string().min(1), name: z.string().min(1), chosen: z.boolean(), spec: z.unknown() })),
    fitCache: z.array(z.unknown()),
    report: z.object({ outputFolder: z.string().nullable(), species: z.array(z.string()) }),
  })
  .passthrough();

interface V2Model {
  id: string;
  name: string;
  species: string;
  spec: unknown;
  chosen: boolean;
  dropBadOffsetRows: boolean;
}

function upgrade(input: unknown): unknown {
  const v1 = v1Schema.parse(input);
  const species = v1.report.species.length ? [...new Set(v1.report.species)] : [''];
  const used = new Set(v1.models.map((m) => m.id));
  const freshId = (base: string, k: number): string => {
    let id = `${base}-${k + 1}`;
    while (used.has(id)) id = `${id}x`;
    used.add(id);
    return id;
  };
  const models: V2Model[] = [];
  const chosenFor = new Set<string>();
  for (const m of v1.models) {
    species.forEach((sp, k) => {
      const chosen = m.chosen && !chosenFor.has(sp);
      if (chosen) chosenFor.add(sp);
      models.push({ id: k === 0 ? m.id : freshId(m.id, k), name: m.name, species: sp, spec: m.spec, chosen, dropBadOffsetRows: false });
    });
  }
  return { ...v1, formatVersion: 2, sites: null, models, fitCache: [] };
}

export const v1ToV2: Migration = {
  from: 1,
  to: 2,
  summary: 'models per species with the offset-row choice, a link to a site-attributes sheet',
  upgrade,
};
