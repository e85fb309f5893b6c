import type { TimeChoice } from '../spec-draft';

/** The season term: one effect per season, a log-linear trend, a smooth curve with chosen degrees of freedom, or none. */
interface Props {
  time: TimeChoice;
  df: number;
  onTime: (t: TimeChoice) => void;
  onDf: (df: number) => void;
}

export function SeasonTerm({ time, df, onTime, onDf }: Props) {
  return (
    <div className="field-row">
      <label className="field">
        <span>Season term</span>
        <select aria-label="Season term" value={time} onChange={(e) => onTime(e.target.value as TimeChoice)}>
          <option value="annual">one effect per season (annual)</option>
          <option value="linear">log-linear trend over seasons</option>
          <option value="smooth">smooth curve over seasons (natural spline)</option>
          <option value="none">no season term</option>
        </select>
      </label>
      {time === 'smooth' && (
        <label className="field is-narrow">
          <span>Curve df</span>
          <input aria-label="Degrees of freedom of the season curve" type="number" min={1} max={20} step={1} value={df} onChange={(e) => onDf(Number(e.target.value))} />
        </label>
      )}
    </div>
  );
}
