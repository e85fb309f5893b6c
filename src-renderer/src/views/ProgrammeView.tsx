import type { ProgrammeOverview } from '@shared/host/contract';

const fmt = new Intl.NumberFormat('en-GB');

/** Overview of the open programme: what was surveyed, where and when. */
export function ProgrammeView({ overview }: { overview: ProgrammeOverview }) {
  const first = overview.seasons[0]?.season;
  const last = overview.seasons[overview.seasons.length - 1]?.season;
  return (
    <section className="programme" aria-labelledby="programme-heading">
      <h1 id="programme-heading">{overview.programme}</h1>
      <p className="lede">{overview.description}</p>
      <dl className="figures">
        <div>
          <dt>Sites</dt>
          <dd data-testid="count-sites">{overview.sites.length}</dd>
        </div>
        <div>
          <dt>Seasons</dt>
          <dd data-testid="count-seasons">{overview.seasons.length}</dd>
          <dd className="sub">{first !== undefined ? `${first}–${last}` : ''}</dd>
        </div>
        <div>
          <dt>Species</dt>
          <dd data-testid="count-species">{overview.species.length}</dd>
        </div>
        <div>
          <dt>Count records</dt>
          <dd>{fmt.format(overview.records)}</dd>
          <dd className="sub">from {overview.sourceFiles.length} workbooks</dd>
        </div>
      </dl>
      <div className="columns">
        <table className="plain" aria-label="Species">
          <caption>Species</caption>
          <thead>
            <tr>
              <th scope="col">Species</th>
              <th scope="col" className="num">Total counted</th>
              <th scope="col" className="num">Sites with records</th>
            </tr>
          </thead>
          <tbody>
            {overview.species.map((s) => (
              <tr key={s.name}>
                <td>{s.name}</td>
                <td className="num">{fmt.format(s.total)}</td>
                <td className="num">{s.sitesPresent}</td>
              </tr>
            ))}
          </tbody>
        </table>
        <table className="plain" aria-label="Seasons">
          <caption>Seasons</caption>
          <thead>
            <tr>
              <th scope="col">Season</th>
              <th scope="col" className="num">Visits</th>
              <th scope="col" className="num">Sites surveyed</th>
            </tr>
          </thead>
          <tbody>
            {overview.seasons.map((s) => (
              <tr key={s.season}>
                <td>{s.season}</td>
                <td className="num">{s.visits}</td>
                <td className="num">{s.sites}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <table className="plain sites" aria-label="Sites">
        <caption>Sites</caption>
        <thead>
          <tr>
            <th scope="col">Site</th>
            <th scope="col">Habitat</th>
            <th scope="col" className="num">Area (m²)</th>
            <th scope="col" className="num">Seasons surveyed</th>
          </tr>
        </thead>
        <tbody>
          {overview.sites.map((s) => (
            <tr key={s.name}>
              <td>{s.name}</td>
              <td>{s.habitat}</td>
              <td className="num">{fmt.format(s.areaM2)}</td>
              <td className="num">{s.seasonsSurveyed}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </section>
  );
}
