export type Stage = 'programme' | 'records' | 'models';

const stages: { id: Stage; label: string; hint: string }[] = [
  { id: 'programme', label: 'Programme', hint: 'Sites, seasons and species in the project' },
  { id: 'records', label: 'Records', hint: 'Import season workbooks, check and clean the counts' },
  { id: 'models', label: 'Models', hint: 'Fit count models per species, compare them and check the diagnostics' },
];

/** The column of work stages down the left edge. */
export function StageRail({ current, onChoose }: { current: Stage; onChoose: (s: Stage) => void }) {
  return (
    <nav className="rail" aria-label="Work stages">
      <ol>
        {stages.map((s, i) => (
          <li key={s.id}>
            <button
              type="button"
              className={s.id === current ? 'rail-step is-current' : 'rail-step'}
              aria-current={s.id === current ? 'step' : undefined}
              title={s.hint}
              onClick={() => onChoose(s.id)}
            >
              <span className="rail-number">{i + 1}</span>
              <span>{s.label}</span>
            </button>
          </li>
        ))}
      </ol>
    </nav>
  );
}
