import { describe, expect, it } from 'vitest';
import { ParseError } from '../../shared/errors';
import {
  applyEdit,
  canRedo,
  canUndo,
  editsFor,
  effectiveOnset,
  emptyJournal,
  journalFromJson,
  journalToJson,
  redo,
  undo,
  type OnsetEdit,
  type OnsetJournal,
  type OnsetResult,
} from '../../shared/emg';

function auto(onsetS: number | null): OnsetResult {
  return {
    onsetS,
    offsetS: null,
    flags: onsetS === null ? ['no-onset'] : [],
    method: 'tkeo-threshold',
    detail: { baselineFromS: 0, baselineToS: 0.3, searchFromS: 0.3, searchToS: 2, baselineMean: 1, baselineSd: 0.1, threshold: 1.6, statistic: 'smoothed |TKEO|', detectionS: onsetS, nanCount: 0 },
  };
}
let n = 0;
function edit(action: OnsetEdit['action'], fromS: number | null, toS: number | null, extra: Partial<OnsetEdit> = {}): OnsetEdit {
  n++;
  return { id: `e${n}`, trialId: 't1', muscle: 'FDS', action, fromS, toS, atIso: `2026-03-01T10:00:0${n % 10}Z`, ...extra };
}

describe('onset journal: accept, move, invalidate, restore', () => {
  const a = auto(1.2);
  it('with no edits the effective onset is the automatic one, unedited', () => {
    expect(effectiveOnset(a, emptyJournal(), 't1', 'FDS')).toEqual({ onsetS: 1.2, edited: false, invalid: false, reviewed: false, automaticS: 1.2 });
  });
  it('accept pins the value and marks it reviewed, not edited', () => {
    const j = applyEdit(emptyJournal(), edit('accept', 1.2, 1.2));
    const e = effectiveOnset(a, j, 't1', 'FDS');
    expect(e).toMatchObject({ onsetS: 1.2, edited: false, reviewed: true, invalid: false });
  });
  it('move sets the new value and shows as edited; the automatic result object is untouched', () => {
    const before = JSON.stringify(a);
    const j = applyEdit(emptyJournal(), edit('move', 1.2, 1.15, { reason: 'artefact spike before the burst' }));
    expect(effectiveOnset(a, j, 't1', 'FDS')).toMatchObject({ onsetS: 1.15, edited: true, automaticS: 1.2, reason: 'artefact spike before the burst' });
    expect(JSON.stringify(a)).toBe(before);
  });
  it('invalidate needs a reason and gives a null, invalid onset; restore returns to the automatic value', () => {
    expect(() => applyEdit(emptyJournal(), edit('invalidate', 1.2, null))).toThrow(/a reason for invalidate/);
    let j = applyEdit(emptyJournal(), edit('invalidate', 1.2, null, { reason: 'electrode lifted' }));
    expect(effectiveOnset(a, j, 't1', 'FDS')).toMatchObject({ onsetS: null, invalid: true, edited: true, reason: 'electrode lifted' });
    j = applyEdit(j, edit('restore', null, null));
    expect(effectiveOnset(a, j, 't1', 'FDS')).toMatchObject({ onsetS: 1.2, invalid: false, edited: false, reviewed: false });
  });
  it('edits apply only to their own trial and muscle', () => {
    const j = applyEdit(emptyJournal(), edit('move', 1.2, 1.0));
    expect(effectiveOnset(a, j, 't2', 'FDS').edited).toBe(false);
    expect(effectiveOnset(a, j, 't1', 'ECR').edited).toBe(false);
    expect(editsFor(j, 't1', 'FDS')).toHaveLength(1);
  });
  it('an edited onset stays edited, at the reviewer value, when detection is re-run with other settings', () => {
    const j = applyEdit(applyEdit(emptyJournal(), edit('accept', 1.2, 1.2)), edit('move', 1.2, 1.18));
    const rerun = auto(1.25);
    expect(effectiveOnset(rerun, j, 't1', 'FDS')).toMatchObject({ onsetS: 1.18, edited: true, automaticS: 1.25 });
    // An accepted value that the new run no longer gives shows as edited too.
    const accepted = applyEdit(emptyJournal(), edit('accept', 1.2, 1.2));
    expect(effectiveOnset(rerun, accepted, 't1', 'FDS')).toMatchObject({ onsetS: 1.2, edited: true, reviewed: true });
    // A reviewer can supply an onset the detector missed.
    expect(effectiveOnset(auto(null), applyEdit(emptyJournal(), edit('move', null, 0.9)), 't1', 'FDS')).toMatchObject({ onsetS: 0.9, edited: true });
  });
});

describe('onset journal: undo and redo with a cursor', () => {
  const a = auto(1.2);
  const e1 = edit('move', 1.2, 1.1);
  const e2 = edit('move', 1.1, 1.0);
  const j2 = applyEdit(applyEdit(emptyJournal(), e1), e2);
  it('undo steps the cursor back and keeps the edit for redo; redo re-applies it', () => {
    const u = undo(j2);
    expect(u.cursor).toBe(1);
    expect(u.edits).toHaveLength(2);
    expect(effectiveOnset(a, u, 't1', 'FDS').onsetS).toBe(1.1);
    expect(canRedo(u)).toBe(true);
    expect(effectiveOnset(a, redo(u), 't1', 'FDS').onsetS).toBe(1.0);
    expect(effectiveOnset(a, undo(u), 't1', 'FDS')).toMatchObject({ onsetS: 1.2, edited: false });
  });
  it('undo at the start and redo at the end change nothing', () => {
    expect(undo(emptyJournal()).cursor).toBe(0);
    expect(canUndo(emptyJournal())).toBe(false);
    expect(redo(j2)).toBe(j2);
  });
  it('a new edit after undo drops the redo tail', () => {
    const j = applyEdit(undo(j2), edit('move', 1.1, 1.05));
    expect(j.edits.map((e) => e.id)).toEqual([e1.id, j.edits[1].id]);
    expect(j.edits[1].toS).toBe(1.05);
    expect(canRedo(j)).toBe(false);
  });
  it('functions are pure: the journal passed in is never changed', () => {
    const snapshot = JSON.stringify(j2);
    undo(j2);
    applyEdit(j2, edit('accept', 1.0, 1.0));
    expect(JSON.stringify(j2)).toBe(snapshot);
    expect(Object.isFrozen(j2.edits)).toBe(true);
  });
  it('refuses a repeated id and malformed edits, naming the field', () => {
    expect(() => applyEdit(j2, { ...e1 })).toThrow(/already used/);
    expect(() => applyEdit(j2, { ...edit('move', 1, null) })).toThrow(/toS \(the new onset\) for a move/);
    expect(() => applyEdit(j2, { ...edit('accept', 1, 1), atIso: 'yesterday' })).toThrow(/atIso/);
    expect(() => applyEdit(j2, { ...edit('accept', 1, 1), action: 'delete' as OnsetEdit['action'] })).toThrow(/action/);
  });
});

describe('onset journal JSON', () => {
  const j: OnsetJournal = undo(
    applyEdit(applyEdit(emptyJournal(), edit('invalidate', 1.2, null, { reason: 'cable moved — artefact' })), edit('restore', null, null)),
  );
  it('round-trips edits, reasons and the cursor', () => {
    const back = journalFromJson(journalToJson(j), 'study.json');
    expect(back).toEqual(j);
    expect(back.cursor).toBe(1);
  });
  it('bad JSON is a ParseError with file name and byte offset', () => {
    const text = '{"format": "forecatch-onset-journal", "version": 1 "cursor": 0, "edits": []}';
    try {
      journalFromJson(text, 'study.json');
      expect.unreachable();
    } catch (err) {
      expect(err).toBeInstanceOf(ParseError);
      expect((err as ParseError).file).toBe('study.json');
      expect((err as ParseError).byteOffset).toBe(text.indexOf('"cursor"'));
    }
  });
  it('a bad edit is a ParseError naming the line and the field', () => {
    const text = journalToJson(j).replace('"invalidate"', '"erase"');
    expect(() => journalFromJson(text, 'study.json')).toThrow(ParseError);
    expect(() => journalFromJson(text, 'study.json')).toThrow(/study.json: line 6: expected edits\[0\]: action to be one of/);
  });
  it('wrong format tag, cursor out of range, duplicate ids', () => {
    expect(() => journalFromJson('{"format":"x","version":1,"cursor":0,"edits":[]}', 'a.json')).toThrow(/format "forecatch-onset-journal"/);
    expect(() => journalFromJson(journalToJson(j).replace('"cursor": 1', '"cursor": 5'), 'a.json')).toThrow(/cursor to be an integer from 0 to 2/);
    const dup = journalToJson(j).replace(/"id":"e\d+"/g, '"id":"same"');
    expect(() => journalFromJson(dup, 'a.json')).toThrow(/a unique id/);
  });
});
