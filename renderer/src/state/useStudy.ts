/**
 * The study the window shows, as React state: what is open, its settings, onset journal and exclusions,
 * the latest evaluation from the worker, progress and errors. Every change of settings, journal or
 * exclusions asks the worker for a fresh evaluation (the engine's fast path); replies that arrive after a
 * newer request are dropped.
 */
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import type { OnsetJournalLike, StudyEvaluation, StudySettings } from '../../../shared/analysis/types';
import { createAnalysisClient, type AnalysisClient } from '../worker/analysisClient';
import type { DemoSpec, Exclusions, StudyOpened } from '../worker/protocol';
import type { Host, OpenedStudy, UserFile } from '../host/host';
import { applyEdit, redo, undo, type OnsetEdit } from '../../../shared/emg/onsetJournal';
import { makeEdit } from './journalOps';

export interface Progress {
  done: number;
  total: number;
  label: string;
}

export interface StudyState {
  study: StudyOpened | null;
  settings: StudySettings | null;
  journal: OnsetJournalLike;
  exclusions: Exclusions;
  evaluation: StudyEvaluation | null;
  /** Time the worker spent in the last evaluation, ms. */
  evaluationMs: number;
  /** True while the shown evaluation is the quick one (bootstrap intervals and delay sweep still coming). */
  refining: boolean;
  progress: Progress | null;
  error: string | null;
  dirty: boolean;
  displayPath: string | null;
}

const EMPTY_JOURNAL: OnsetJournalLike = { edits: [], cursor: 0 };

export function useStudy(host: Host) {
  const clientRef = useRef<AnalysisClient | null>(null);
  if (!clientRef.current) clientRef.current = createAnalysisClient();
  const client = clientRef.current;
  const [state, setState] = useState<StudyState>({
    study: null,
    settings: null,
    journal: EMPTY_JOURNAL,
    exclusions: {},
    evaluation: null,
    evaluationMs: 0,
    refining: false,
    progress: null,
    error: null,
    dirty: false,
    displayPath: null,
  });
  const requestSeq = useRef(0);
  const stateRef = useRef(state);
  stateRef.current = state;

  // the worker lives as long as the window (StrictMode's trial unmount must not stop it)

  const fail = useCallback((err: unknown) => {
    setState((s) => ({ ...s, progress: null, error: err instanceof Error ? err.message : String(err) }));
  }, []);

  const fullTimer = useRef<ReturnType<typeof setTimeout> | null>(null);

  /**
   * Re-evaluates in two steps: a quick evaluation (no bootstrap, no delay sweep; tens of ms) answers the
   * click at once, and the full one follows once the user pauses (400 ms), filling in the intervals.
   */
  const evaluate = useCallback(
    async (settings: StudySettings, journal: OnsetJournalLike, exclusions: Exclusions) => {
      const seq = ++requestSeq.current;
      if (fullTimer.current) clearTimeout(fullTimer.current);
      const onProgress = (done: number, total: number, label: string) => {
        if (seq === requestSeq.current) setState((s) => ({ ...s, progress: { done, total, label } }));
      };
      try {
        const r = await client.call({ type: 'evaluate', settings, journal, exclusions, quick: true }, onProgress);
        if (seq !== requestSeq.current) return;
        // until the full evaluation arrives, keep showing the last delay sweep (marked as updating)
        setState((s) => ({
          ...s,
          evaluation: r.evaluation.delaySensitivity.length === 0 && s.evaluation ? { ...r.evaluation, delaySensitivity: s.evaluation.delaySensitivity } : r.evaluation,
          evaluationMs: r.ms,
          refining: true,
          progress: null,
          error: null,
        }));
        fullTimer.current = setTimeout(() => {
          if (seq !== requestSeq.current) return;
          void client
            .call({ type: 'evaluate', settings, journal, exclusions, quick: false })
            .then((full) => {
              if (seq === requestSeq.current) setState((s) => ({ ...s, evaluation: full.evaluation, evaluationMs: full.ms, refining: false }));
            })
            .catch((err) => seq === requestSeq.current && fail(err));
        }, 400);
      } catch (err) {
        if (seq === requestSeq.current) fail(err);
      }
    },
    [client, fail],
  );

  const afterOpen = useCallback(
    async (opened: StudyOpened, displayPath: string | null) => {
      setState((s) => ({ ...s, study: opened, settings: opened.settings, journal: opened.journal, exclusions: Object.fromEntries(opened.trials.filter((t) => t.excluded).map((t) => [t.id, t.excludeReason ?? 'excluded'])), evaluation: null, dirty: false, displayPath, error: null, progress: { done: 0, total: opened.trials.length, label: 'preparing trials' } }));
      const exclusions = Object.fromEntries(opened.trials.filter((t) => t.excluded).map((t) => [t.id, t.excludeReason ?? 'excluded']));
      const prepared = await client.call({ type: 'prepare', settings: opened.settings }, (done, total, label) => setState((s) => ({ ...s, progress: { done, total, label } })));
      setState((s) => ({ ...s, settings: prepared.settings }));
      await evaluate(prepared.settings, opened.journal, exclusions);
    },
    [client, evaluate],
  );

  const openDemo = useCallback(
    async (demo: DemoSpec) => {
      try {
        setState((s) => ({ ...s, progress: { done: 0, total: 1, label: 'generating the demo study' }, error: null }));
        const opened = await client.call({ type: 'openDemo', demo });
        await afterOpen(opened, null);
      } catch (err) {
        fail(err);
      }
    },
    [client, afterOpen, fail],
  );

  const openStudy = useCallback(
    async (study: OpenedStudy | null) => {
      if (!study) return;
      try {
        const opened = await client.call({ type: 'openStudy', name: study.name, text: study.text });
        let missing = opened.missing;
        for (let i = 0; i < missing.length; i++) {
          setState((s) => ({ ...s, progress: { done: i, total: missing.length, label: `reading ${missing[i]}` } }));
          const bytes = await study.readFile(missing[i]);
          const r = await client.call({ type: 'addFile', relativePath: missing[i], bytes }, undefined, [bytes.buffer as ArrayBuffer]);
          if (i === missing.length - 1) missing = r.missing;
        }
        await afterOpen({ ...opened, missing }, study.displayPath);
      } catch (err) {
        fail(err);
      }
    },
    [client, afterOpen, fail],
  );

  const addRecordings = useCallback(
    async (files: UserFile[] | null) => {
      if (!files || !stateRef.current.study) return;
      try {
        for (const f of files) await client.call({ type: 'addFile', relativePath: f.name, bytes: f.bytes });
        const s = stateRef.current;
        if (s.settings) await afterOpen(s.study!, s.displayPath);
      } catch (err) {
        fail(err);
      }
    },
    [client, afterOpen, fail],
  );

  const change = useCallback(
    (next: Partial<Pick<StudyState, 'settings' | 'journal' | 'exclusions'>>) => {
      const s = stateRef.current;
      if (!s.settings) return;
      const merged = { settings: next.settings ?? s.settings, journal: next.journal ?? s.journal, exclusions: next.exclusions ?? s.exclusions };
      setState((prev) => ({ ...prev, ...merged, dirty: true }));
      void evaluate(merged.settings!, merged.journal, merged.exclusions);
    },
    [evaluate],
  );

  /** Appends a reviewer's edit through the shared journal (a malformed edit is reported, not thrown). */
  const record = useCallback(
    (edit: OnsetEdit) => {
      try {
        change({ journal: applyEdit(stateRef.current.journal, edit) });
      } catch (err) {
        fail(err);
      }
    },
    [change, fail],
  );

  const actions = useMemo(
    () => ({
      openDemo,
      openStudy,
      addRecordings,
      setSettings: (settings: StudySettings) => change({ settings }),
      moveOnset: (trialId: string, muscle: string, fromS: number | null, toS: number) => record(makeEdit(trialId, muscle, 'move', fromS, toS)),
      invalidateOnset: (trialId: string, muscle: string, fromS: number | null, reason?: string) => record(makeEdit(trialId, muscle, 'invalidate', fromS, null, reason)),
      restoreOnset: (trialId: string, muscle: string, fromS: number | null, _automaticS: number | null) => record(makeEdit(trialId, muscle, 'restore', fromS, null)),
      undo: () => change({ journal: undo(stateRef.current.journal) }),
      redo: () => change({ journal: redo(stateRef.current.journal) }),
      exclude: (trialId: string, reason: string) => change({ exclusions: { ...stateRef.current.exclusions, [trialId]: reason || 'excluded by the reviewer' } }),
      include: (trialId: string) => {
        const { [trialId]: _drop, ...rest } = stateRef.current.exclusions;
        change({ exclusions: rest });
      },
      exports: async () => {
        const s = stateRef.current;
        if (!s.settings) throw new Error('no study is open');
        return client.call({ type: 'exports', settings: s.settings, journal: s.journal, exclusions: s.exclusions });
      },
      studyText: async () => {
        const s = stateRef.current;
        if (!s.settings) throw new Error('no study is open');
        return (await client.call({ type: 'studyText', settings: s.settings, journal: s.journal, exclusions: s.exclusions })).text;
      },
      trialDetail: (trialId: string) => client.call({ type: 'trialDetail', trialId }),
      markSaved: (displayPath: string | null) => setState((s) => ({ ...s, dirty: false, displayPath: displayPath ?? s.displayPath })),
      dismissError: () => setState((s) => ({ ...s, error: null })),
      reportError: fail,
    }),
    [openDemo, openStudy, addRecordings, change, record, client, fail],
  );

  // title and autosave follow the document state
  useEffect(() => {
    host.setDocumentState(state.study ? state.displayPath ?? state.study.name : 'No study', state.dirty);
  }, [host, state.study, state.displayPath, state.dirty]);

  useEffect(() => {
    if (!state.dirty || !state.study) return;
    const timer = setTimeout(() => {
      void actions.studyText().then((text) => host.autosave(text)).catch(() => undefined);
    }, 3000);
    return () => clearTimeout(timer);
  }, [host, actions, state.dirty, state.study, state.journal, state.exclusions, state.settings]);

  return { state, actions };
}

export type StudyActions = ReturnType<typeof useStudy>['actions'];
