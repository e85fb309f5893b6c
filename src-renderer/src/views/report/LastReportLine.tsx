import type { ReportHistoryEntry } from '@shared/project/report-history';
import { madeOn } from '@shared/report/since-last-section';

/** The files of an entry, briefly: "stem .pdf, .html and .xlsx" when they share a name. */
function filesText(files: ReportHistoryEntry['files']): string {
  if (!files.length) return 'not recorded';
  const stems = new Set(files.map((f) => f.name.replace(/\.[^.]+$/, '')));
  if (stems.size > 1) return files.map((f) => f.name).join(', ');
  const exts = files.map((f) => f.name.slice(f.name.lastIndexOf('.')));
  return `${[...stems][0]} ${exts.length > 1 ? `${exts.slice(0, -1).join(', ')} and ${exts.at(-1)}` : exts[0]}`;
}

/** One short line from the project's report history: when the last report was made, with what, and its files. */
export function LastReportLine({ history }: { history: readonly ReportHistoryEntry[] }) {
  const last = history.at(-1);
  if (!last) return <p className="hint" data-testid="report-last">Report history: none made from this project yet.</p>;
  const earlier = history.length - 1;
  return (
    <p className="hint" data-testid="report-last">
      Report history: last made {madeOn(last.madeAt)} with {last.software.name} {last.software.version}, files {filesText(last.files)}
      {earlier > 0 ? ` (${earlier} earlier)` : ''}. The next report says what changed since.
    </p>
  );
}
