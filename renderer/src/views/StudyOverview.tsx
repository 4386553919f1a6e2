/**
 * Study overview: the trial table (subject, condition, covariates, onset per muscle, contact, status) with
 * sorting, filtering, exclusion with a reason, and keyboard navigation; a row opens its trial.
 */
import { useMemo, useState, type KeyboardEvent } from 'react';
import type { StudyEvaluation, TrialSpec } from '../../../shared/analysis/types';
import { buildTrialRows, fmtS, type TrialRow } from './trialRows';

type StatusFilter = 'all' | 'edited' | 'excluded' | 'no-onset' | 'bad-data' | 'usable';

export interface StudyOverviewProps {
  trials: TrialSpec[];
  muscles: string[];
  evaluation: StudyEvaluation | null;
  exclusions: Record<string, string>;
  selectedTrialId: string | null;
  onSelect: (trialId: string) => void;
  onOpenTrial: (trialId: string) => void;
  onExclude: (trialId: string, reason: string) => void;
  onInclude: (trialId: string) => void;
}

function sortValue(row: TrialRow, key: string): number | string {
  if (key === 'id' || key === 'subject' || key === 'condition') return row[key];
  if (key === 'contact') return row.contactS ?? Infinity;
  if (key === 'duration') return Number.isFinite(row.motionDurationS) ? row.motionDurationS : Infinity;
  if (key.startsWith('onset:')) return row.muscles[key.slice(6)]?.onsetS ?? Infinity;
  if (key.startsWith('cov:')) return row.covariates[key.slice(4)] ?? '';
  return '';
}

export function StudyOverview(props: StudyOverviewProps) {
  const [filter, setFilter] = useState('');
  const [status, setStatus] = useState<StatusFilter>('all');
  const [sort, setSort] = useState<{ key: string; dir: 1 | -1 }>({ key: 'id', dir: 1 });
  const [excluding, setExcluding] = useState<{ id: string; reason: string } | null>(null);

  const rows = useMemo(() => buildTrialRows(props.trials, props.evaluation, props.exclusions), [props.trials, props.evaluation, props.exclusions]);
  const covariateKeys = useMemo(() => [...new Set(props.trials.flatMap((t) => Object.keys(t.covariates)))], [props.trials]);

  const shown = useMemo(() => {
    const needle = filter.trim().toLowerCase();
    const out = rows.filter((r) => {
      if (needle && !`${r.id} ${r.subject} ${r.condition}`.toLowerCase().includes(needle)) return false;
      if (status === 'edited') return r.edited;
      if (status === 'excluded') return r.excluded;
      if (status === 'no-onset') return r.noOnset;
      if (status === 'bad-data') return r.badData;
      if (status === 'usable') return !r.excluded && !r.noOnset && !r.badData;
      return true;
    });
    out.sort((a, b) => {
      const va = sortValue(a, sort.key);
      const vb = sortValue(b, sort.key);
      const c = typeof va === 'number' && typeof vb === 'number' ? va - vb : String(va).localeCompare(String(vb), undefined, { numeric: true });
      return c * sort.dir;
    });
    return out;
  }, [rows, filter, status, sort]);

  const header = (key: string, label: string, title?: string) => (
    <th
      key={key}
      scope="col"
      title={title}
      aria-sort={sort.key === key ? (sort.dir === 1 ? 'ascending' : 'descending') : 'none'}
      onClick={() => setSort((s) => ({ key, dir: s.key === key ? ((-s.dir) as 1 | -1) : 1 }))}
    >
      {label}
      {sort.key === key ? (sort.dir === 1 ? ' ▲' : ' ▼') : ''}
    </th>
  );

  const onRowKey = (e: KeyboardEvent<HTMLTableRowElement>, index: number) => {
    if (e.key === 'ArrowDown' || e.key === 'ArrowUp') {
      e.preventDefault();
      const next = shown[index + (e.key === 'ArrowDown' ? 1 : -1)];
      if (next) {
        props.onSelect(next.id);
        (document.querySelector(`tr[data-trial-id="${CSS.escape(next.id)}"]`) as HTMLElement | null)?.focus();
      }
    } else if (e.key === 'Enter') props.onOpenTrial(shown[index].id);
  };

  const counts = {
    total: rows.length,
    excluded: rows.filter((r) => r.excluded).length,
    edited: rows.filter((r) => r.edited).length,
    noOnset: rows.filter((r) => r.noOnset).length,
    bad: rows.filter((r) => r.badData).length,
  };

  return (
    <section className="view overview" aria-label="Study overview">
      <div className="toolbar">
        <label>
          Find <input type="search" value={filter} placeholder="trial, subject or condition" onChange={(e) => setFilter(e.target.value)} aria-label="Filter trials" />
        </label>
        <label>
          Show{' '}
          <select value={status} onChange={(e) => setStatus(e.target.value as StatusFilter)} aria-label="Status filter">
            <option value="all">all trials</option>
            <option value="usable">usable only</option>
            <option value="edited">edited onsets</option>
            <option value="excluded">excluded</option>
            <option value="no-onset">no onset</option>
            <option value="bad-data">bad data</option>
          </select>
        </label>
        <span className="counts">
          {counts.total} trials · {counts.excluded} excluded · {counts.edited} edited · {counts.noOnset} without onset · {counts.bad} with bad data
        </span>
      </div>
      <div className="table-wrap">
        <table className="trials" aria-label="Trials">
          <thead>
            <tr>
              {header('id', 'Trial')}
              {header('subject', 'Subject')}
              {header('condition', 'Condition')}
              {covariateKeys.map((k) => header(`cov:${k}`, k))}
              {props.muscles.map((m) => header(`onset:${m}`, `${m} onset (s)`, `EMG onset of ${m}, seconds on the recording clock`))}
              {header('contact', 'Contact (s)', 'Measured contact, seconds on the recording clock')}
              {header('duration', 'Motion (s)', 'Motion duration from release to contact, seconds')}
              <th scope="col">Status</th>
              <th scope="col">
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {shown.map((r, i) => (
              <tr
                key={r.id}
                data-trial-id={r.id}
                tabIndex={0}
                className={`${r.excluded ? 'excluded' : ''} ${props.selectedTrialId === r.id ? 'selected' : ''}`}
                aria-selected={props.selectedTrialId === r.id}
                onClick={() => props.onSelect(r.id)}
                onDoubleClick={() => props.onOpenTrial(r.id)}
                onKeyDown={(e) => onRowKey(e, i)}
                title={r.flagText.join('\n') || undefined}
              >
                <td>
                  <button className="link" onClick={() => props.onOpenTrial(r.id)}>
                    {r.id}
                  </button>
                </td>
                <td>{r.subject}</td>
                <td>{r.condition}</td>
                {covariateKeys.map((k) => (
                  <td key={k} className="num">
                    {typeof r.covariates[k] === 'number' ? Number(r.covariates[k]).toFixed(3).replace(/\.?0+$/, '') : String(r.covariates[k] ?? '')}
                  </td>
                ))}
                {props.muscles.map((m) => {
                  const c = r.muscles[m];
                  return (
                    <td key={m} className={`num ${c?.edited ? 'edited' : ''}`} data-muscle={m} data-col="onset">
                      {c?.invalid ? 'invalid' : fmtS(c?.onsetS)}
                      {c?.edited && !c.invalid ? ' ✎' : ''}
                    </td>
                  );
                })}
                <td className="num">{fmtS(r.contactS)}</td>
                <td className="num">{fmtS(r.motionDurationS)}</td>
                <td className="status">
                  {r.excluded && <span className="chip chip-excluded" title={r.excludeReason}>excluded</span>}
                  {r.edited && <span className="chip chip-edited">edited</span>}
                  {r.noOnset && <span className="chip chip-noonset">no onset</span>}
                  {r.badData && <span className="chip chip-bad">bad data</span>}
                </td>
                <td>
                  {r.excluded ? (
                    <button onClick={() => props.onInclude(r.id)} title={`Excluded: ${r.excludeReason}`}>
                      Include
                    </button>
                  ) : excluding?.id === r.id ? (
                    <form
                      className="exclude-form"
                      onSubmit={(e) => {
                        e.preventDefault();
                        props.onExclude(r.id, excluding.reason.trim());
                        setExcluding(null);
                      }}
                    >
                      <input autoFocus aria-label="Reason for excluding" placeholder="reason" value={excluding.reason} onChange={(e) => setExcluding({ id: r.id, reason: e.target.value })} />
                      <button type="submit">Exclude</button>
                      <button type="button" onClick={() => setExcluding(null)}>
                        Cancel
                      </button>
                    </form>
                  ) : (
                    <button onClick={() => setExcluding({ id: r.id, reason: '' })}>Exclude…</button>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}
