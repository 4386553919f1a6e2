/**
 * The Forecatch window: a header with the study's actions and the three views (study overview, trial,
 * hypothesis comparison), the settings panel, a status line with progress, drag and drop of study files,
 * menu commands and keyboard shortcuts, autosave recovery, and the About box.
 */
import { useCallback, useEffect, useMemo, useRef, useState, type DragEvent } from 'react';
import type { Host, MenuCommand } from './host/host';
import { studyFromFiles } from './host/browserHost';
import { useStudy } from './state/useStudy';
import { StudyOverview } from './views/StudyOverview';
import { TrialView } from './views/TrialView';
import { ComparisonView } from './views/ComparisonView';
import { SettingsPanel } from './views/SettingsPanel';
import { AboutDialog } from './views/AboutDialog';
import { DEFAULT_DEMO, demoFromHash } from './worker/demoStudy';
import { renderFigures } from './figures';
import type { ThemeName } from './plot/palette';
import type { RecoveredWork } from './host/host';

type ViewName = 'overview' | 'trial' | 'comparison';

function initialTheme(): ThemeName {
  const saved = typeof localStorage !== 'undefined' ? localStorage.getItem('forecatch.theme') : null;
  if (saved === 'light' || saved === 'dark') return saved;
  return window.matchMedia?.('(prefers-color-scheme: dark)').matches ? 'dark' : 'light';
}

export function App({ host }: { host: Host }) {
  const { state, actions } = useStudy(host);
  const [view, setView] = useState<ViewName>('overview');
  const [trialId, setTrialId] = useState<string | null>(null);
  const [theme, setTheme] = useState<ThemeName>(initialTheme);
  const [about, setAbout] = useState(false);
  const [notice, setNotice] = useState<string | null>(null);
  const [recovered, setRecovered] = useState<RecoveredWork | null>(null);
  const [dragging, setDragging] = useState(false);
  const mainRef = useRef<HTMLElement>(null);

  useEffect(() => {
    document.documentElement.dataset.theme = theme;
    try {
      localStorage.setItem('forecatch.theme', theme);
    } catch {
      /* private mode */
    }
  }, [theme]);

  // startup: the demo when asked for (#demo), and any autosaved work left by a crash
  useEffect(() => {
    const demo = demoFromHash(window.location.hash);
    if (demo) void actions.openDemo(demo);
    void host.recoverAutosave().then((r) => r && setRecovered(r));
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, []);

  const trials = state.study?.trials ?? [];
  const muscles = useMemo(() => state.settings?.emgChannels.map((c) => c.muscle) ?? [], [state.settings]);
  const order = useMemo(() => trials.map((t) => t.id), [trials]);

  const openTrial = useCallback((id: string) => {
    setTrialId(id);
    setView('trial');
  }, []);
  const step = useCallback(
    (delta: number) => {
      if (order.length === 0) return;
      const i = trialId ? order.indexOf(trialId) : -1;
      const next = order[Math.min(order.length - 1, Math.max(0, i + delta))];
      setTrialId(next);
    },
    [order, trialId],
  );

  const confirmDiscard = useCallback(() => !state.dirty || window.confirm('This study has unsaved onset edits. Discard them?'), [state.dirty]);

  const save = useCallback(
    async (saveAs: boolean) => {
      if (!state.study) return;
      try {
        const text = await actions.studyText();
        const name = (state.study.name.replace(/\.[^.]+$/, '') || 'study').replace(/[^\w.-]+/g, '_') + '.forecatch.json';
        const where = await host.saveStudy(text, name.startsWith('Demo') ? 'demo-study.forecatch.json' : name, saveAs);
        if (where) {
          actions.markSaved(host.kind === 'electron' ? where : null);
          await host.clearAutosave();
          setNotice(`Saved ${where}`);
        }
      } catch (err) {
        actions.reportError(err);
      }
    },
    [state.study, actions, host],
  );

  const exportTables = useCallback(async () => {
    try {
      const out = await actions.exports();
      const where = await host.exportFiles([
        { name: 'trials.csv', data: out.trialsCsv },
        { name: 'models.csv', data: out.modelsCsv },
        { name: 'methods.txt', data: out.methodsTxt },
      ]);
      if (where) setNotice(`Exported trials.csv, models.csv and methods.txt: ${where}`);
    } catch (err) {
      actions.reportError(err);
    }
  }, [actions, host]);

  const exportFigures = useCallback(async () => {
    try {
      if (!mainRef.current) return;
      const files = await renderFigures(mainRef.current);
      if (files.length === 0) return setNotice('This view has no figures to export.');
      const where = await host.exportFiles(files);
      if (where) setNotice(`Exported ${files.length} figure files: ${where}`);
    } catch (err) {
      actions.reportError(err);
    }
  }, [actions, host]);

  const command = useCallback(
    (c: MenuCommand) => {
      switch (c) {
        case 'open-study':
          if (confirmDiscard()) void host.openStudy().then(actions.openStudy);
          break;
        case 'open-trial-list':
          if (confirmDiscard()) void host.openTrialList().then(actions.openStudy);
          break;
        case 'open-recording':
          void host.openRecordings().then(actions.addRecordings);
          break;
        case 'open-demo':
          if (confirmDiscard()) void actions.openDemo(DEFAULT_DEMO);
          break;
        case 'save':
          void save(false);
          break;
        case 'save-as':
          void save(true);
          break;
        case 'export-tables':
          void exportTables();
          break;
        case 'export-figures':
          void exportFigures();
          break;
        case 'undo':
          actions.undo();
          break;
        case 'redo':
          actions.redo();
          break;
        case 'next-trial':
          step(1);
          break;
        case 'previous-trial':
          step(-1);
          break;
        case 'view-overview':
          setView('overview');
          break;
        case 'view-trial':
          if (!trialId && order[0]) setTrialId(order[0]);
          setView('trial');
          break;
        case 'view-comparison':
          setView('comparison');
          break;
        case 'toggle-theme':
          setTheme((t) => (t === 'light' ? 'dark' : 'light'));
          break;
        case 'about':
          setAbout(true);
          break;
      }
    },
    [actions, host, save, exportTables, exportFigures, step, confirmDiscard, trialId, order],
  );
  const commandRef = useRef(command);
  commandRef.current = command;
  useEffect(() => host.onCommand((c) => commandRef.current(c)), [host]);
  useEffect(() => host.onOpenRecent((p) => confirmDiscard() && void host.openRecentStudy(p).then(actions.openStudy)), [host, actions, confirmDiscard]);

  const onDrop = async (e: DragEvent) => {
    e.preventDefault();
    setDragging(false);
    const files = Array.from(e.dataTransfer.files);
    if (files.length === 0) return;
    const study = await studyFromFiles(files);
    if (study) {
      if (confirmDiscard()) await actions.openStudy(study);
    } else if (state.study) {
      await actions.addRecordings(await Promise.all(files.map(async (f) => ({ name: f.name, bytes: new Uint8Array(await f.arrayBuffer()) }))));
    } else setNotice('Drop a study file (.json) or trial list (.csv) together with its recordings.');
  };

  const restoreRecovered = async () => {
    if (!recovered) return;
    setRecovered(null);
    await actions.openStudy({ name: recovered.displayPath ?? 'recovered study', text: recovered.text, displayPath: recovered.displayPath, readFile: () => Promise.reject(new Error('the recovered study names files that must be opened with the study itself: use Open Study')) });
    setNotice('Recovered the unsaved work of the previous session.');
  };

  const canUndo = state.journal.cursor > 0;
  const canRedo = state.journal.cursor < state.journal.edits.length;
  const progress = state.progress;

  return (
    <div className={`app ${dragging ? 'dragging' : ''}`} onDragOver={(e) => (e.preventDefault(), setDragging(true))} onDragLeave={() => setDragging(false)} onDrop={onDrop}>
      <header className="header">
        <span className="brand" aria-label="Forecatch">
          <img src="./icon.svg" alt="" width={22} height={22} /> Forecatch
        </span>
        <nav className="tabs" role="tablist" aria-label="Views">
          {(['overview', 'trial', 'comparison'] as ViewName[]).map((v) => (
            <button key={v} role="tab" aria-selected={view === v} className={view === v ? 'active' : ''} disabled={!state.study} onClick={() => command(v === 'overview' ? 'view-overview' : v === 'trial' ? 'view-trial' : 'view-comparison')}>
              {v === 'overview' ? 'Study' : v === 'trial' ? 'Trial' : 'Hypotheses'}
            </button>
          ))}
        </nav>
        <span className="study-name" title={state.displayPath ?? undefined}>
          {state.study ? `${state.study.name}${state.dirty ? ' ●' : ''}` : 'No study open'}
        </span>
        <span className="spacer" />
        <div className="actions">
          <button onClick={() => command('open-demo')}>Open demo</button>
          <button onClick={() => command('open-study')} title="Open a study file with its recordings (Ctrl+O)">
            Open study…
          </button>
          <button onClick={() => command('open-recording')} disabled={!state.study} title="Add recordings the study names">
            Add recordings…
          </button>
          <button onClick={() => command('save')} disabled={!state.study} title="Save the study with its onset edits (Ctrl+S)">
            Save
          </button>
          <button onClick={() => command('export-tables')} disabled={!state.evaluation} title="trials.csv, models.csv and methods.txt (Ctrl+E)">
            Export tables
          </button>
          <button onClick={() => command('export-figures')} disabled={!state.evaluation} title="The figures of this view as PNG and SVG (Ctrl+Shift+E)">
            Export figures
          </button>
          <button onClick={() => command('toggle-theme')} aria-label="Switch between light and dark theme" title="Light/dark (Ctrl+Shift+L)">
            {theme === 'light' ? '☾' : '☀'}
          </button>
          <button onClick={() => setAbout(true)} aria-label="About Forecatch">
            ?
          </button>
        </div>
      </header>
      {recovered && (
        <div className="banner" role="alert">
          Unsaved work from {new Date(recovered.savedIso).toLocaleString()} was kept after the last session ended.
          <button onClick={() => void restoreRecovered()}>Restore it</button>
          <button
            onClick={() => {
              setRecovered(null);
              void host.clearAutosave();
            }}
          >
            Discard
          </button>
        </div>
      )}
      {state.error && (
        <div className="banner error" role="alert">
          {state.error} <button onClick={actions.dismissError}>Dismiss</button>
        </div>
      )}
      {notice && (
        <div className="banner notice" role="status">
          {notice} <button onClick={() => setNotice(null)}>OK</button>
        </div>
      )}
      {progress && (
        <div className="progress" role="progressbar" aria-label="Analysing the study" aria-valuemin={0} aria-valuemax={progress.total} aria-valuenow={progress.done}>
          <div className="bar" style={{ width: `${(100 * progress.done) / Math.max(1, progress.total)}%` }} />
          <span>
            {progress.label} ({progress.done}/{progress.total})
          </span>
        </div>
      )}
      <div className="body">
        {state.settings && <SettingsPanel settings={state.settings} onChange={actions.setSettings} />}
        <main ref={mainRef} className="main">
          {!state.study && !progress && (
            <div className="welcome">
              <h1>Forecatch</h1>
              <p>Open a study (its study file together with its recordings), drop the files here, or explore the demo study of invented rail-lab data.</p>
              <button className="primary" onClick={() => command('open-demo')}>
                Open the demo study
              </button>
              <p className="caution small">Research use only: not a medical device; the output is not a clinical assessment.</p>
            </div>
          )}
          {state.study && state.settings && view === 'overview' && (
            <StudyOverview
              trials={trials}
              muscles={muscles}
              evaluation={state.evaluation}
              exclusions={state.exclusions}
              selectedTrialId={trialId}
              onSelect={setTrialId}
              onOpenTrial={openTrial}
              onExclude={actions.exclude}
              onInclude={actions.include}
            />
          )}
          {state.study && state.settings && view === 'trial' && trialId && state.evaluation && (
            <TrialView
              trialId={trialId}
              settings={state.settings}
              evaluation={state.evaluation}
              theme={theme}
              excludedReason={state.exclusions[trialId]}
              loadDetail={actions.trialDetail}
              onMove={(m, from, to) => actions.moveOnset(trialId, m, from, to)}
              onInvalidate={(m, from) => actions.invalidateOnset(trialId, m, from)}
              onRestore={(m, from, auto) => actions.restoreOnset(trialId, m, from, auto)}
              onUndo={actions.undo}
              onRedo={actions.redo}
              canUndo={canUndo}
              canRedo={canRedo}
              onPrevious={() => step(-1)}
              onNext={() => step(1)}
              onError={actions.reportError}
            />
          )}
          {state.study && state.settings && view === 'comparison' && state.evaluation && (
            <ComparisonView
              evaluation={state.evaluation}
              settings={state.settings}
              theme={theme}
              onOpenTrial={openTrial}
              refining={state.refining}
              onPainted={() => {
                // hypotheses | quick or full | time: read by the browser benchmark
                document.body.dataset.comparisonPainted = `${state.evaluation?.hypotheses.join(',')}|${state.refining ? 'quick' : 'full'}|${performance.now().toFixed(1)}`;
              }}
            />
          )}
        </main>
      </div>
      <footer className="status">
        {state.evaluation ? (
          <span data-testid="status-evaluation">
            {state.evaluation.trials.length} trial×muscle rows · {state.evaluation.hypotheses.length} hypotheses · evaluated in {state.evaluationMs.toFixed(0)} ms{state.refining ? ' · refining intervals…' : ` · settings ${state.evaluation.settingsHash.slice(0, 8)}`}
          </span>
        ) : (
          <span>{host.kind === 'electron' ? 'Desktop' : 'Browser build'}</span>
        )}
        <span className="spacer" />
        <span className="muted">{state.journal.cursor} onset edit(s) in effect</span>
      </footer>
      {about && <AboutDialog onClose={() => setAbout(false)} />}
    </div>
  );
}
