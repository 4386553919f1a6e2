/**
 * Analysis settings changed in place: the hypothesis set, the visuomotor delay, the state used at the
 * cutoff and the onset detector. Every change re-evaluates the study without reloading (hypotheses, delay
 * and state source take the cheap path; a new onset detector re-prepares the trials, with progress).
 */
import { useState } from 'react';
import type { AnalysisHypothesis, OnsetSettingsLike, StudySettings } from '../../../shared/analysis/types';
import { STANDARD_HYPOTHESES } from '../../../shared/analysis/defaultSettings';
import { hypothesisColour, hypothesisStyleIndex } from '../plot/palette';

const G0 = 9.80665;

/** Hypotheses the panel offers: the standard set plus quadratic drag; a custom gravity can be added. */
const CATALOG: AnalysisHypothesis[] = [...STANDARD_HYPOTHESES.map((h) => ({ ...h })), { id: 'gravity-drag', kind: 'drag', gMps2: G0, dragPerM: 0.02, label: 'Earth gravity with air drag (0.02 /m)' }];

const ONSET_METHODS: { value: OnsetSettingsLike['method']; label: string }[] = [
  { value: 'baseline-threshold', label: 'baseline + k SD (Hodges & Bui 1996)' },
  { value: 'double-threshold', label: 'double threshold (Bonato et al. 1998)' },
  { value: 'tkeo-threshold', label: 'Teager-Kaiser energy (Li et al. 2007)' },
  { value: 'change-point', label: 'change point (Micera et al. 1998)' },
];

export interface SettingsPanelProps {
  settings: StudySettings;
  onChange: (settings: StudySettings) => void;
}

export function SettingsPanel({ settings, onChange }: SettingsPanelProps) {
  const [customG, setCustomG] = useState('4.9');
  const chosen = new Set(settings.hypotheses.map((h) => h.id));
  const catalog = [...CATALOG, ...settings.hypotheses.filter((h) => !CATALOG.some((c) => c.id === h.id))];
  const delayMs = settings.cutoff.kind === 'onset-minus-delay' ? settings.cutoff.delayMs : 0;

  const toggle = (h: AnalysisHypothesis, on: boolean) => {
    const next = on ? catalog.filter((c) => chosen.has(c.id) || c.id === h.id) : settings.hypotheses.filter((x) => x.id !== h.id);
    if (next.length === 0) return; // at least one hypothesis
    onChange({ ...settings, hypotheses: next.map((x) => settings.hypotheses.find((s) => s.id === x.id) ?? { ...x }) });
  };

  const addCustom = () => {
    const g = Number(customG);
    if (!(g >= 0 && g <= 50)) return;
    const id = `gravity-${g}`;
    if (chosen.has(id)) return;
    onChange({ ...settings, hypotheses: [...settings.hypotheses, { id, kind: 'gravity', gMps2: g, label: `gravity ${g} m/s²` }] });
  };

  return (
    <aside className="settings" aria-label="Analysis settings">
      <h2>Hypotheses</h2>
      <ul className="hypotheses">
        {catalog.map((h) => {
          const k = hypothesisStyleIndex(h.id, settings.hypotheses.map((x) => x.id));
          return (
            <li key={h.id}>
              <label>
                <input type="checkbox" checked={chosen.has(h.id)} onChange={(e) => toggle(h, e.target.checked)} data-hypothesis={h.id} />
                <span className="swatch" style={{ background: chosen.has(h.id) ? hypothesisColour(k) : 'transparent' }} />
                {h.label ?? h.id}
              </label>
            </li>
          );
        })}
      </ul>
      <div className="row">
        <label>
          gravity (m/s²){' '}
          <input type="number" min={0} max={50} step={0.1} value={customG} onChange={(e) => setCustomG(e.target.value)} aria-label="Custom gravity in m/s²" />
        </label>
        <button onClick={addCustom}>Add</button>
      </div>
      <h2>Information cutoff</h2>
      <label className="block">
        Visuomotor delay: <strong data-testid="delay-value">{delayMs} ms</strong>
        <input
          type="range"
          min={0}
          max={250}
          step={5}
          value={delayMs}
          aria-label="Visuomotor delay in ms"
          onChange={(e) => onChange({ ...settings, cutoff: { kind: 'onset-minus-delay', delayMs: Number(e.target.value) } })}
        />
      </label>
      <label className="block">
        State at the cutoff{' '}
        <select value={settings.stateSource} onChange={(e) => onChange({ ...settings, stateSource: e.target.value as StudySettings['stateSource'] })} aria-label="State at the cutoff">
          <option value="smoothed">smoothed (all data, RTS)</option>
          <option value="filtered">filtered (data up to the cutoff)</option>
        </select>
      </label>
      <h2>EMG onset</h2>
      <label className="block">
        Detector{' '}
        <select value={settings.onset.method} onChange={(e) => onChange({ ...settings, onset: { ...settings.onset, method: e.target.value as OnsetSettingsLike['method'] } })} aria-label="Onset detector">
          {ONSET_METHODS.map((m) => (
            <option key={m.value} value={m.value}>
              {m.label}
            </option>
          ))}
        </select>
      </label>
      <p className="muted small">Changing the detector re-detects every onset; manual edits stay in the journal and still apply.</p>
    </aside>
  );
}
