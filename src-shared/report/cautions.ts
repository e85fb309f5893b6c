/** The cautions every trend report carries, whatever the data. */
import type { Section } from './model';

export const GENERAL_CAUTIONS: readonly string[] = [
  'Counts are an index of abundance, not the size of the population: they depend on how many animals are detected, and the chance of detection is not known here.',
  'Changes in detection or in effort over the years (observers, methods, timing, weather, site access) can bias a trend up or down; the offsets correct only for the effort that was recorded.',
  'A trend from the surveyed sites speaks for those sites; it reaches a wider area only as far as the sites were chosen to represent it.',
  "Defer to the programme's protocol for how results are used, and ask a statistician before basing a decision on these numbers.",
];

export function cautionsSection(extra: readonly string[] = []): Section {
  return { id: 'cautions', heading: 'Read this first', blocks: [{ kind: 'caution', title: 'Cautions', items: [...GENERAL_CAUTIONS, ...extra] }] };
}
