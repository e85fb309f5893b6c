import type { ModelOutliers } from './model-outliers';
import { probabilityText } from './model-outliers';
import type { RecordLink } from './record-link';

/**
 * The model's outlier flags listed for review beside the cleaning grid: one
 * line per improbable season total, most extreme first, each with a button
 * that shows its visit records (a shorter keyboard route than walking a
 * chart's points). Opening and closing is the analyst's; the list scrolls.
 */
export const MODEL_FLAGS_CLOSED = 36;
export const MODEL_FLAGS_OPEN = 36 + 184;

export function ModelFlagsSection({ outliers, open, onToggle, onShow }: { outliers: ModelOutliers; open: boolean; onToggle(open: boolean): void; onShow(link: RecordLink): void }) {
  const flags = outliers.result.flags;
  return (
    <details className="model-flags" open={open} onToggle={(e) => onToggle((e.currentTarget as HTMLDetailsElement).open)} data-testid="model-flags">
      <summary>
        <span className="chip chip-model">model</span> {flags.length} season total{flags.length === 1 ? '' : 's'} of {outliers.species} improbable under “{outliers.model}”
      </summary>
      <ol className="model-flags-list">
        {flags.map((f) => (
          <li key={`${f.key.site}|${f.key.season}`}>
            <span>
              {f.key.site}, {f.key.season}: total {f.count}, expected {Number(f.expected.toPrecision(3))}, {probabilityText(f.probability)}
            </span>
            <button type="button" className="button is-small" onClick={() => onShow({ label: `${outliers.species} at ${f.key.site}, season ${f.key.season} (a model flag)`, keys: [f.key] })}>
              Show visits
            </button>
          </li>
        ))}
      </ol>
    </details>
  );
}
