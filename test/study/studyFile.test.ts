import { describe, expect, it } from 'vitest';
import { parseStudyFile, StudyFileError } from '../../shared/study/parseStudyFile';
import { serializeStudy, STUDY_SCHEMA_VERSION } from '../../shared/study/studyFile';
import { importTrialList } from '../../shared/study/importTrialList';
import { defaultStudySettings } from '../../shared/analysis/defaultSettings';
import { ParseError } from '../../shared/errors';

const trial = { id: 't1', subject: 's1', condition: 'a1', file: 's1/t1.c3d', excluded: false, covariates: { drop_m: 1.5 } };

describe('study file (JSON, versioned schema)', () => {
  it('round-trips through serializeStudy and parseStudyFile', () => {
    const study = { schemaVersion: STUDY_SCHEMA_VERSION as typeof STUDY_SCHEMA_VERSION, name: 'x', settings: defaultStudySettings(), trials: [trial], journal: { edits: [], cursor: 0 } };
    const back = parseStudyFile(serializeStudy(study), 'study.json');
    expect(back.settings).toEqual(study.settings);
    expect(back.trials[0]).toMatchObject(trial);
  });

  it('migrates schema 1 (delayMs, hypothesis ids, exclude text, top-level edits) to the current schema', () => {
    const v1 = {
      schemaVersion: 1,
      name: 'old',
      settings: { delayMs: 80, hypotheses: ['gravity', 'constant-velocity'] },
      trials: [{ id: 't1', subject: 's1', condition: 'a1', file: 'a.c3d', exclude: 'marker lost' }, { id: 't2', subject: 's1', condition: 'a1', file: 'b.c3d', exclude: false }],
      edits: [{ id: 'e', trialId: 't1', muscle: 'FCR', action: 'move', fromS: 1, toS: 1.01, atIso: '2026-01-01T00:00:00Z' }],
    };
    const s = parseStudyFile(JSON.stringify(v1), 'old.json');
    expect(s.schemaVersion).toBe(2);
    expect(s.settings.cutoff).toEqual({ kind: 'onset-minus-delay', delayMs: 80 });
    expect(s.settings.hypotheses.map((h) => h.id)).toEqual(['gravity', 'constant-velocity']);
    expect(s.trials[0]).toMatchObject({ excluded: true, excludeReason: 'marker lost' });
    expect(s.trials[1].excluded).toBe(false);
    expect(s.journal).toMatchObject({ cursor: 1 });
  });

  it('names the JSON path and line of an invalid field', () => {
    const text = JSON.stringify({ schemaVersion: 2, name: 'x', settings: { cutoff: { kind: 'onset-minus-delay', delayMs: -5 } }, trials: [] }, null, 2);
    let err: unknown;
    try {
      parseStudyFile(text, 'bad.json');
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(StudyFileError);
    expect(err).toBeInstanceOf(ParseError);
    expect((err as StudyFileError).jsonPath).toBe('$.settings.cutoff.delayMs');
    expect((err as Error).message).toMatch(/^bad\.json: line 7, column \$\.settings\.cutoff\.delayMs: expected a number/);
  });

  it('rejects a missing or newer schema version, invalid JSON (with line) and duplicate trial ids', () => {
    expect(() => parseStudyFile('{"name": "x"}', 'a.json')).toThrow(/schemaVersion/);
    expect(() => parseStudyFile('{"schemaVersion": 99}', 'a.json')).toThrow(/newer Forecatch/);
    expect(() => parseStudyFile('{\n"schemaVersion": 2,\n"name": }', 'a.json')).toThrow(ParseError);
    const dup = { schemaVersion: 2, trials: [trial, trial] };
    expect(() => parseStudyFile(JSON.stringify(dup), 'a.json')).toThrow(/\$\.trials\[1\]\.id/);
  });
});

describe('trial list CSV import', () => {
  it('reads the fixed columns, keeps other columns as numeric or text covariates, and reads exclude as flag or reason', () => {
    const csv = 'trial,subject,condition,file,emg_file,exclude,note,drop_m,site\n' +
      't1,s1,a0,s1/t1.c3d,s1/t1.edf,,first,1.5,lab A\n' +
      't2,s1,a1,s1/t2.c3d,,yes,,2.25,lab A\n' +
      't3,s2,a1,"s2/t 3.c3d",,ball slipped,,3e-1,"lab, B"\n';
    const trials = importTrialList(csv, 'trials.csv');
    expect(trials).toHaveLength(3);
    expect(trials[0]).toMatchObject({ id: 't1', subject: 's1', condition: 'a0', file: 's1/t1.c3d', emgFile: 's1/t1.edf', excluded: false, note: 'first', covariates: { drop_m: 1.5, site: 'lab A' } });
    expect(trials[1]).toMatchObject({ excluded: true, excludeReason: 'excluded in the trial list', covariates: { drop_m: 2.25 } });
    expect(trials[2]).toMatchObject({ file: 's2/t 3.c3d', excluded: true, excludeReason: 'ball slipped', covariates: { drop_m: 0.3, site: 'lab, B' } });
  });
  it('accepts semicolons and a byte-order mark', () => {
    const trials = importTrialList('\uFEFFtrial;subject;condition;file\nt1;s1;c;f.c3d\n', 'x.csv');
    expect(trials[0]).toMatchObject({ id: 't1', file: 'f.c3d' });
  });
  it('names the line of a missing column, an empty cell or a duplicate id', () => {
    expect(() => importTrialList('trial,subject,file\nt1,s1,f\n', 'x.csv')).toThrow(/x\.csv: line 1, column condition/);
    expect(() => importTrialList('trial,subject,condition,file\nt1,s1,c,\n', 'x.csv')).toThrow(/line 2, column file/);
    expect(() => importTrialList('trial,subject,condition,file\nt1,s1,c,a\nt1,s1,c,b\n', 'x.csv')).toThrow(/line 3, column trial: expected a unique trial id/);
  });
});
