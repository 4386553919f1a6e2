/** Pure pieces of the renderer: keyboard shortcuts, demo selection from the URL, the study table's rows. */
import { describe, expect, it } from 'vitest';
import { shortcutCommand } from '../../renderer/src/host/shortcuts';
import { DEFAULT_DEMO, demoFromHash } from '../../renderer/src/worker/demoStudy';
import { buildTrialRows } from '../../renderer/src/views/trialRows';
import { DEFAULT_INVALID_REASON, makeEdit } from '../../renderer/src/state/journalOps';
import { applyEdit, effectiveOnset, emptyJournal, onsetEditProblem, redo, undo } from '../../shared/emg/onsetJournal';
import { hypothesisStyleIndex } from '../../renderer/src/plot/palette';
import { exportFigure, hiddenTracesCss, omittedNames } from '../../renderer/src/plot/switchedOff';
import { symbolPath } from '../../renderer/src/plot/markerSymbols';
import { HYPOTHESIS_SYMBOLS } from '../../renderer/src/plot/palette';
import type { StudyEvaluation, TrialSpec } from '../../shared/analysis/types';

const key = (k: string, mods: Partial<{ ctrlKey: boolean; metaKey: boolean; shiftKey: boolean; altKey: boolean }> = {}) => ({ key: k, ctrlKey: false, metaKey: false, shiftKey: false, altKey: false, ...mods });

describe('browser keyboard shortcuts mirror the desktop menu accelerators (electron/menuTemplate.ts)', () => {
  it('maps the usual keys', () => {
    expect(shortcutCommand(key('o', { ctrlKey: true }))).toBe('open-study');
    expect(shortcutCommand(key('S', { ctrlKey: true, shiftKey: true }))).toBe('save-as');
    expect(shortcutCommand(key('s', { metaKey: true }))).toBe('save');
    expect(shortcutCommand(key('z', { ctrlKey: true }))).toBe('undo');
    expect(shortcutCommand(key('y', { ctrlKey: true }))).toBe('redo');
    expect(shortcutCommand(key('Z', { ctrlKey: true, shiftKey: true }))).toBe('redo');
    expect(shortcutCommand(key('e', { ctrlKey: true }))).toBe('export-tables');
    expect(shortcutCommand(key('ArrowDown', { altKey: true }))).toBe('next-trial');
    expect(shortcutCommand(key('ArrowUp', { altKey: true }))).toBe('previous-trial');
  });
  it('leaves plain keys to the views', () => {
    expect(shortcutCommand(key('z'))).toBeNull();
    expect(shortcutCommand(key('ArrowDown'))).toBeNull();
  });
});

describe('demo selection from the page address', () => {
  it('#demo is the bundled demo; parameters make a generated one; anything else none', () => {
    expect(demoFromHash('#demo')).toEqual(DEFAULT_DEMO);
    expect(demoFromHash('#demo?subjects=4&trials=50')).toMatchObject({ subjects: 4, trialsPerSubject: 50, muscles: 2 });
    expect(demoFromHash('#demo?muscles=16&post=59')).toMatchObject({ muscles: 16, postS: 59 });
    expect(demoFromHash('#demo?trials=-3&muscles=9999')).toMatchObject({ trialsPerSubject: DEFAULT_DEMO.trialsPerSubject, muscles: DEFAULT_DEMO.muscles });
    expect(demoFromHash('')).toBeNull();
    expect(demoFromHash('#other')).toBeNull();
  });
});

describe('the window records onset edits through the shared journal (shared/emg/onsetJournal)', () => {
  it('a new edit after an undo drops the undone edit; undo/redo only move the cursor', () => {
    let j = emptyJournal();
    j = applyEdit(j, makeEdit('t1', 'FCR', 'move', 1.0, 1.01));
    j = applyEdit(j, makeEdit('t1', 'FCR', 'move', 1.01, 1.02));
    j = undo(j);
    expect(j.cursor).toBe(1);
    expect(redo(j).cursor).toBe(2);
    j = applyEdit(j, makeEdit('t1', 'FCR', 'invalidate', 1.01, null));
    expect(j.edits.map((e) => e.action)).toEqual(['move', 'invalidate']);
    expect(redo(j)).toBe(j);
    expect(undo(undo(undo(j))).cursor).toBe(0);
  });
  it('every edit the views make is valid for the journal: unique ids, invalidate with a reason, no target for restore', () => {
    const edits = [
      makeEdit('t1', 'FCR', 'move', 1.0, 1.01),
      makeEdit('t1', 'FCR', 'invalidate', 1.01, null),
      makeEdit('t1', 'FCR', 'invalidate', 1.01, null, 'electrode lift-off'),
      makeEdit('t1', 'FCR', 'restore', null, 0.99),
    ];
    for (const e of edits) expect(onsetEditProblem(e)).toBeNull();
    expect(new Set(edits.map((e) => e.id)).size).toBe(edits.length);
    expect(edits[1].reason).toBe(DEFAULT_INVALID_REASON);
    expect(edits[2].reason).toBe('electrode lift-off');
    expect(edits[3].toS).toBeNull();
  });
  it('invalidate then restore gives back the detector onset, shown as unedited', () => {
    const automatic = { onsetS: 0.95 } as Parameters<typeof effectiveOnset>[0];
    let j = applyEdit(emptyJournal(), makeEdit('t1', 'FCR', 'invalidate', 0.95, null));
    expect(effectiveOnset(automatic, j, 't1', 'FCR')).toMatchObject({ onsetS: null, invalid: true, edited: true });
    j = applyEdit(j, makeEdit('t1', 'FCR', 'restore', null, 0.95));
    expect(effectiveOnset(automatic, j, 't1', 'FCR')).toMatchObject({ onsetS: 0.95, invalid: false, edited: false });
  });
});

describe('hypothesis styles stay with the hypothesis', () => {
  it('removing one hypothesis does not recolour the others', () => {
    const all = ['constant-velocity', 'gravity', 'half-gravity', 'gravity-3'];
    const fewer = ['constant-velocity', 'half-gravity', 'gravity-3'];
    for (const id of fewer) expect(hypothesisStyleIndex(id, fewer)).toBe(hypothesisStyleIndex(id, all));
    expect(new Set(all.map((id) => hypothesisStyleIndex(id, all))).size).toBe(all.length);
  });
});

describe('study table rows', () => {
  const spec = (id: string): TrialSpec => ({ id, subject: 's1', condition: 'a1', file: `${id}.c3d`, excluded: false, covariates: { drop_m: 1.2 } });
  const row = (trialId: string, muscle: string, onsetS: number | null, edited = false, invalid = false) => ({
    trialId, subject: 's1', condition: 'a1', muscle, releaseS: 0.5, onsetS, automaticOnsetS: 0.9, onsetEdited: edited, onsetInvalid: invalid, contactS: 1.1,
    motionDurationS: 0.6, excluded: false, usable: onsetS !== null, covariates: {}, hypotheses: [],
  });
  it('gathers muscles per trial and derives the edited, no-onset, bad-data and excluded flags', () => {
    const evaluation = {
      trials: [row('t1', 'FCR', 0.91, true), row('t1', 'ECR', 0.95), row('t2', 'FCR', null), row('t2', 'ECR', null, true, true)],
      flags: [{ trialId: 't3', flag: { code: 'too-many-gaps', message: 'gaps', severity: 'error' } }],
      failed: [],
    } as unknown as StudyEvaluation;
    const rows = buildTrialRows([spec('t1'), spec('t2'), spec('t3')], evaluation, { t2: 'ball touched the rail' });
    expect(rows.map((r) => r.id)).toEqual(['t1', 't2', 't3']);
    expect(rows[0]).toMatchObject({ edited: true, noOnset: false, excluded: false, contactS: 1.1 });
    expect(rows[0].muscles.FCR).toEqual({ onsetS: 0.91, automaticOnsetS: 0.9, edited: true, invalid: false });
    expect(rows[1]).toMatchObject({ noOnset: true, excluded: true, excludeReason: 'ball touched the rail' });
    expect(rows[1].muscles.ECR.invalid).toBe(true);
    expect(rows[2]).toMatchObject({ badData: true, noOnset: false });
  });
});

describe('exported figures leave out what the user switched off', () => {
  it('drops the traces named by the plot element and keeps the rest, in order, with the layout unchanged', () => {
    const layout = { height: 420 };
    const data = [{ name: 'no gravity' }, { name: 'Earth gravity' }, { name: 'half Earth gravity' }, { showlegend: false }];
    const fig = exportFigure(data, layout, omittedNames(JSON.stringify(['Earth gravity'])));
    expect(fig.data).toEqual([{ name: 'no gravity' }, { name: 'half Earth gravity' }, { showlegend: false }]);
    expect(fig.layout).toBe(layout);
  });
  it('gives every kept trace a legend entry when the figure asks for the plotly legend in exports', () => {
    const fig = exportFigure([{ name: 'a', showlegend: false }, { name: 'b', showlegend: false }], { margin: { l: 70, t: 16 } }, ['b'], true);
    expect(fig.data).toEqual([{ name: 'a', showlegend: true }]);
    expect(fig.layout).toEqual({ margin: { l: 70, t: 56 } });
  });
  it('hides switched-off trace groups of one figure by their uid, and nothing for unsafe uids', () => {
    expect(hiddenTracesCss('ttc-at-onset', ['hyp1', 'hyp3'])).toBe('[data-plot-id="ttc-at-onset"] .tracehyp1,\n[data-plot-id="ttc-at-onset"] .tracehyp3 { display: none; }');
    expect(hiddenTracesCss('ttc-at-onset', [])).toBe('');
    expect(hiddenTracesCss('ttc-at-onset', ['a b', '"x'])).toBe('');
  });
  it('the page legend draws a distinct shape for every hypothesis symbol', () => {
    const paths = HYPOTHESIS_SYMBOLS.map(symbolPath);
    expect(new Set(paths).size).toBe(HYPOTHESIS_SYMBOLS.length);
  });
  it('omits nothing when the attribute is absent or malformed', () => {
    expect(omittedNames(undefined)).toEqual([]);
    expect(omittedNames('not json')).toEqual([]);
    expect(omittedNames('{"a":1}')).toEqual([]);
    expect(omittedNames('["a", 3]')).toEqual(['a']);
  });
});
