import type { ProgrammeOverview } from '@shared/host/contract';
import { PROGRAMME_NAME, PROGRAMME_SLUG, PONDS } from '@shared/demo/programme';
import { simulateDemo, visitRecords } from '@shared/demo/simulate';
import { seasonsOf } from '@shared/demo/truth';

/**
 * Summary of the built-in demo programme, computed from its seeded
 * simulation: the ponds, seasons and species the demo workbooks hold.
 */
export async function demoOverview(): Promise<ProgrammeOverview> {
  const sim = simulateDemo();
  const records = visitRecords(sim);
  const seasons = seasonsOf(sim.truth);
  const pondSeasons = new Map<string, Set<number>>();
  for (const v of sim.visits) {
    const s = pondSeasons.get(v.pond) ?? new Set<number>();
    s.add(v.season);
    pondSeasons.set(v.pond, s);
  }
  return {
    programme: PROGRAMME_NAME,
    description: `An invented regional amphibian call survey: volunteers listen at ${PONDS.length} ponds on several evenings each spring and count calling adults of ${sim.truth.species.length} species. Simulated data, for trying Tallywise out.`,
    sites: PONDS.map((p) => ({ name: p.name, habitat: p.habitat, areaM2: p.areaM2, seasonsSurveyed: pondSeasons.get(p.name)?.size ?? 0 })),
    seasons: seasons.map((season) => {
      const visits = sim.visits.filter((v) => v.season === season);
      return { season, visits: visits.length, sites: new Set(visits.map((v) => v.pond)).size };
    }),
    species: sim.truth.species.map((sp) => {
      const mine = records.filter((r) => r.species === sp.key);
      return {
        name: sp.label,
        total: mine.reduce((a, r) => a + r.count, 0),
        sitesPresent: new Set(mine.filter((r) => r.count > 0).map((r) => r.pond)).size,
      };
    }),
    sourceFiles: seasons.map((s) => `${PROGRAMME_SLUG}-${s}.xlsx`),
    records: records.length,
  };
}
