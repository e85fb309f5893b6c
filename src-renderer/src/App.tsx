import { useEffect, useState } from 'react';
import type { AppInfo, ProgrammeOverview } from '@shared/host/contract';
import { call, onHostCommand } from './host';
import { ProgrammeView } from './views/ProgrammeView';
import { StageRail, type Stage } from './components/StageRail';
import { Cautions } from './components/Cautions';

type Load = { state: 'loading' } | { state: 'ready'; overview: ProgrammeOverview } | { state: 'failed'; message: string };

export function App() {
  const [info, setInfo] = useState<AppInfo | null>(null);
  const [load, setLoad] = useState<Load>({ state: 'loading' });
  const [stage, setStage] = useState<Stage>('programme');

  const openDemo = () => {
    setLoad({ state: 'loading' });
    call('demo:overview', {})
      .then((overview) => setLoad({ state: 'ready', overview }))
      .catch((err: Error) => setLoad({ state: 'failed', message: err.message }));
  };

  useEffect(() => {
    call('app:info', {}).then(setInfo).catch(() => setInfo(null));
    openDemo();
    return onHostCommand((command) => {
      if (command === 'open-demo') openDemo();
    });
  }, []);

  const title = load.state === 'ready' ? load.overview.programme : 'Tallywise';
  return (
    <div className="shell">
      <header className="topbar">
        <span className="brand" aria-label="Tallywise">
          <span className="brand-mark" aria-hidden="true">
            ▮▮▮▮<span className="brand-slash">╱</span>
          </span>
          Tallywise
        </span>
        <span className="topbar-title" data-testid="programme-title">
          {title}
        </span>
        <span className="topbar-version">{info ? `v${info.version}` : ''}</span>
      </header>
      <StageRail current={stage} onChoose={setStage} />
      <main className="workspace" aria-live="polite">
        {load.state === 'loading' && <p className="status">Reading the programme…</p>}
        {load.state === 'failed' && (
          <div className="problem" role="alert">
            <strong>The programme could not be opened.</strong> {load.message}
          </div>
        )}
        {load.state === 'ready' && stage === 'programme' && <ProgrammeView overview={load.overview} />}
        <Cautions />
      </main>
    </div>
  );
}
