import type { PredictorChoice, PredictorColumn } from '../spec-draft';

/** One part's predictors: each column unused, a number or a factor, and a factor's reference level. */
export function PredictorPicker({ label, columns, chosen, onChange }: { label: string; columns: readonly PredictorColumn[]; chosen: readonly PredictorChoice[]; onChange: (p: PredictorChoice[]) => void }) {
  if (!columns.length) return <p className="hint">The analysis table has no other columns to use as {label.toLowerCase()}.</p>;
  const set = (col: PredictorColumn, type: string, reference = '') => {
    const rest = chosen.filter((p) => p.column !== col.name);
    if (type === 'numeric' || type === 'factor') {
      const at = chosen.findIndex((p) => p.column === col.name);
      const next = [...rest];
      next.splice(at < 0 ? next.length : at, 0, { column: col.name, type, reference: type === 'factor' ? reference : '' });
      onChange(next);
    } else onChange(rest);
  };
  return (
    <table className="plain picker">
      <caption>{label}</caption>
      <tbody>
        {columns.map((col) => {
          const p = chosen.find((x) => x.column === col.name);
          return (
            <tr key={col.name}>
              <th scope="row">{col.name}</th>
              <td>
                <select aria-label={`${label}: ${col.name}`} value={p?.type ?? 'none'} onChange={(e) => set(col, e.target.value)}>
                  <option value="none">not used</option>
                  <option value="numeric" disabled={!col.numeric}>
                    number
                  </option>
                  <option value="factor">factor (levels)</option>
                </select>
                {p?.type === 'factor' && (
                  <select className="picker-reference" aria-label={`Reference level of ${col.name}`} value={p.reference} onChange={(e) => set(col, 'factor', e.target.value)}>
                    <option value="">against {col.levels[0] ?? '—'} (first)</option>
                    {col.levels.slice(1).map((l) => (
                      <option key={l} value={l}>
                        against {l}
                      </option>
                    ))}
                  </select>
                )}
              </td>
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}
