import type { PlantedProblem } from './mess';
import { HABITATS, PROGRAMME_NAME, PROGRAMME_SLUG, PONDS } from './programme';
import { logSlope, type DemoTruth } from './truth';

/**
 * The demo's true parameters and planted problems as data and as Markdown,
 * for resources/demo/truth.json and resources/demo/README.md (a test checks
 * that the committed files equal what these functions give).
 */
export function truthJson(truth: DemoTruth, seed: number): unknown {
  return {
    programme: PROGRAMME_NAME,
    slug: PROGRAMME_SLUG,
    invented: 'Fictional programme; the counts are simulated from the parameters below.',
    seed,
    seasons: { first: truth.firstSeason, last: truth.lastSeason, base: truth.baseSeason },
    ponds: PONDS.length,
    model:
      'log mu = intercept + log(1 + annualChange) * (season - base) + tempPerDegC * (waterTemp - tempCentreC) + habitat + u_pond + log(minutes) + log(area_m2); ' +
      'u_pond ~ Normal(0, siteSd); count ~ NegBinomial(mu, theta) (variance mu + mu^2/theta); an extra zero with probability zeroInflation.',
    tempCentreC: truth.tempCentreC,
    offsetCoefficients: truth.offsetCoefficients,
    habitatReference: HABITATS[0],
    species: truth.species.map((s) => ({ ...s, logSlope: round(logSlope(s), 6), alpha: round(1 / s.theta, 6) })),
    design: truth.design,
  };
}

function round(x: number, digits: number): number {
  const f = 10 ** digits;
  return Math.round(x * f) / f;
}

function mdTable(header: readonly string[], rows: readonly (readonly (string | number)[])[]): string {
  const line = (cells: readonly (string | number)[]) => `| ${cells.map((c) => String(c).replace(/\|/g, '\\|')).join(' | ')} |`;
  return [line(header), line(header.map(() => '---')), ...rows.map(line)].join('\n');
}

const signed = (x: number) => (x > 0 ? `+${x}` : String(x));
const percent = (x: number) => `${signed(round(x * 100, 2))} %`;

export function truthMarkdown(truth: DemoTruth): string {
  const species = mdTable(
    ['Species (sheet column)', 'key', 'annual change', 'log slope', 'intercept', 'temp per °C', ...HABITATS.map((h) => `habitat ${h}`), 'pond SD', 'theta', 'extra zeros'],
    truth.species.map((s) => [
      s.label,
      `\`${s.key}\``,
      percent(s.annualChange),
      round(logSlope(s), 4),
      s.intercept,
      s.tempPerDegC,
      ...HABITATS.map((h) => signed(s.habitat[h])),
      s.siteSd,
      s.theta,
      s.zeroInflation,
    ]),
  );
  const d = truth.design;
  const common = mdTable(
    ['Setting', 'Value'],
    [
      ['Seasons', `${truth.firstSeason}–${truth.lastSeason} (trend measured from ${truth.baseSeason})`],
      ['Offsets', `log(minutes) with coefficient ${truth.offsetCoefficients.logMinutes}, log(area m²) with coefficient ${truth.offsetCoefficients.logArea}`],
      ['Temperature centre', `${truth.tempCentreC} °C (the intercept is at this water temperature)`],
      ['Pond not visited in a season', `probability ${d.skipSeasonProb}`],
      ['Visits per pond and season', Object.entries(d.visitsWeights).map(([n, w]) => `${n} (${w})`).join(', ')],
      ['Listening minutes', d.minutesWeights.map((m) => `${m.minutes} (${m.weight})`).join(', ')],
      ['Usual observer', `probability ${d.usualObserverProb}, otherwise any observer`],
      ['Survey window', `day ${d.firstDay} to day ${d.lastDay} of the year, visits spread evenly`],
      ['Water temperature', `${d.tempAtFirstDay} °C + ${d.tempRisePerDay} °C a day + season shift (SD ${d.tempSeasonSd}) + visit noise (SD ${d.tempVisitSd}), at least ${d.tempFloorC} °C, to 0.1 °C`],
    ],
  );
  return `${species}\n\n${common}`;
}

export function plantedMarkdown(planted: readonly PlantedProblem[]): string {
  return mdTable(
    ['Season', 'Kind', 'Cell', 'Header', 'Written', 'Clean value'],
    planted.map((p) => [p.season, p.kind, `${p.sheet}!${p.column}${p.row}`, p.header, p.found === '' ? '(blank)' : `\`${JSON.stringify(p.found)}\``, p.cleanValue === null ? '(delete row)' : p.shouldBe]),
  );
}
