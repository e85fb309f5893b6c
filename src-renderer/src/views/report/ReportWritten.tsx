import { madeOn } from '@shared/report/since-last-section';
import { call } from '../../host';
import type { WrittenReport } from './use-report-run';

/** The files of the last report, with buttons to open the PDF or show the folder. */
export function ReportWritten({ written, onProblem }: { written: WrittenReport; onProblem: (message: string) => void }) {
  const open = (channel: 'file:open' | 'file:reveal', path: string) =>
    call(channel, { path })
      .then((r) => (r.ok ? undefined : onProblem(`"${path}" could not be opened here; open it from the file manager.`)))
      .catch((err: Error) => onProblem(err.message));
  return (
    <div className="report-written" data-testid="report-written">
      <h3>Last report</h3>
      <p className="hint">
        {written.species.join(', ')}; made {madeOn(written.madeAt)}.
      </p>
      <ul>
        {[written.pdf, written.html, written.xlsx].map((p) => (
          <li key={p}>
            <code>{p}</code>
          </li>
        ))}
      </ul>
      <p className="report-make">
        <button type="button" className="button is-primary" onClick={() => void open('file:open', written.pdf)} data-testid="open-pdf">
          Open PDF
        </button>
        <button type="button" className="button" onClick={() => void open('file:reveal', written.pdf)} data-testid="open-folder">
          Show in folder
        </button>
      </p>
    </div>
  );
}
