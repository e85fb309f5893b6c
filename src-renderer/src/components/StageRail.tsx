import type { KeyboardEvent } from 'react';

export type Stage = 'programme' | 'records' | 'models' | 'report';

const stages: { id: Stage; label: string; hint: string }[] = [
  { id: 'programme', label: 'Programme', hint: 'Sites, seasons and species in the project' },
  { id: 'records', label: 'Records', hint: 'Import season workbooks, check and clean the counts' },
  { id: 'models', label: 'Models', hint: 'Fit count models per species, compare them and check the diagnostics' },
  { id: 'report', label: 'Report', hint: 'Write the annual trend report (PDF, HTML, XLSX) from the chosen models' },
];

/** Up/Down (and Home/End) move between the stages' buttons; Enter or Space opens the one focused. */
function moveFocus(e: KeyboardEvent<HTMLOListElement>): void {
  const buttons = [...e.currentTarget.querySelectorAll<HTMLButtonElement>('button.rail-step')];
  const at = buttons.indexOf(document.activeElement as HTMLButtonElement);
  const step: Record<string, number> = { ArrowDown: at + 1, ArrowUp: at - 1, Home: 0, End: buttons.length - 1 };
  if (at < 0 || !(e.key in step)) return;
  e.preventDefault();
  buttons[(step[e.key] + buttons.length) % buttons.length]?.focus();
}

/** The column of work stages down the left edge. */
export function StageRail({ current, onChoose }: { current: Stage; onChoose: (s: Stage) => void }) {
  return (
    <nav className="rail" aria-label="Work stages">
      <ol onKeyDown={moveFocus}>
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
