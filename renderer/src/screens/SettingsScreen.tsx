/** Workspace settings: default service level and its kind, review period, lead time, horizon, week start. */
import { type FormEvent, useEffect, useState } from 'react';
import type { WorkspaceSettings } from '../../../app/api/contract';
import { useApi, useLoad } from '../api-context';
import { parseNumber } from '../components/adjustment-form';
import { StatusLines } from '../components/StatusLines';

const DAYS = ['Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday', 'Sunday'];

export function SettingsScreen() {
  const { api, changed } = useApi();
  const loaded = useLoad((a) => a.getSettings(), []);
  const [form, setForm] = useState<Record<string, string>>({});
  const [kind, setKind] = useState<'cycle' | 'fill'>('cycle');
  const [weekStart, setWeekStart] = useState(1);
  const [message, setMessage] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);

  useEffect(() => {
    const s = loaded.data;
    if (!s) return;
    setForm({
      serviceLevel: String(Math.round(s.serviceLevel * 1000) / 10),
      reviewPeriodWeeks: String(s.reviewPeriodWeeks),
      leadTimeWeeks: String(s.leadTimeWeeks),
      horizonWeeks: String(s.horizonWeeks),
      cutA: String(Math.round(s.abcCutoffs[0] * 100)),
      cutB: String(Math.round(s.abcCutoffs[1] * 100)),
      slA: String(Math.round(s.abcServiceLevels.A * 1000) / 10),
      slB: String(Math.round(s.abcServiceLevels.B * 1000) / 10),
      slC: String(Math.round(s.abcServiceLevels.C * 1000) / 10),
    });
    setKind(s.serviceKind);
    setWeekStart(s.weekStartDay);
  }, [loaded.data]);

  const field = (k: string, label: string, suffix: string) => (
    <label>
      {label}
      <span className="with-suffix">
        <input
          className="suffix-input"
          inputMode="decimal"
          value={form[k] ?? ''}
          onChange={(e) => setForm((f) => ({ ...f, [k]: e.target.value }))}
        />
        <span className="muted">{suffix}</span>
      </span>
    </label>
  );

  const save = async (e: FormEvent) => {
    e.preventDefault();
    const n = (k: string) => parseNumber(form[k] ?? '');
    const values = [
      'serviceLevel',
      'reviewPeriodWeeks',
      'leadTimeWeeks',
      'horizonWeeks',
      'cutA',
      'cutB',
      'slA',
      'slB',
      'slC',
    ].map(n);
    if (values.some((v) => v === null)) {
      setError('Every box needs a number.');
      return;
    }
    const [sl, rp, lt, hz, ca, cb, la, lb, lc] = values as number[];
    const settings: WorkspaceSettings = {
      serviceLevel: sl / 100,
      serviceKind: kind,
      reviewPeriodWeeks: rp,
      leadTimeWeeks: lt,
      horizonWeeks: hz,
      weekStartDay: weekStart,
      abcCutoffs: [ca / 100, cb / 100],
      abcServiceLevels: { A: la / 100, B: lb / 100, C: lc / 100 },
    };
    try {
      await api.saveSettings(settings);
      setError(null);
      setMessage('Saved. The next run uses these settings.');
      changed();
    } catch (err) {
      setMessage(null);
      setError(err instanceof Error ? err.message : String(err));
    }
  };

  return (
    <section className="pad page" aria-labelledby="settings-h">
      <div className="toolbar">
        <h1 id="settings-h">Settings</h1>
      </div>
      <StatusLines error={loaded.error} />
      {loaded.data && (
        <form className="settings" onSubmit={save} aria-label="Workspace settings">
          <fieldset>
            <legend>Service target for items without their own</legend>
            {field('serviceLevel', 'Service level', '%')}
            <label>
              Measured as
              <select value={kind} onChange={(e) => setKind(e.target.value as 'cycle' | 'fill')}>
                <option value="cycle">cycle service level (chance of no stock-out per cycle)</option>
                <option value="fill">fill rate (share of demand served from stock)</option>
              </select>
            </label>
          </fieldset>
          <fieldset>
            <legend>Planning rhythm</legend>
            {field('reviewPeriodWeeks', 'Review period (0 = continuous review)', 'weeks')}
            {field('leadTimeWeeks', 'Default lead time', 'weeks')}
            {field('horizonWeeks', 'Forecast horizon', 'weeks')}
            <label>
              Weeks start on
              <select value={weekStart} onChange={(e) => setWeekStart(Number(e.target.value))}>
                {DAYS.map((d, i) => (
                  <option key={d} value={i + 1}>
                    {d}
                    {i === 0 ? ' (ISO 8601)' : ''}
                  </option>
                ))}
              </select>
            </label>
          </fieldset>
          <fieldset>
            <legend>ABC classes by annual consumption value</legend>
            {field('cutA', 'Class A up to', '% of value')}
            {field('cutB', 'Class B up to', '% of value')}
            {field('slA', 'Service level for A', '%')}
            {field('slB', 'Service level for B', '%')}
            {field('slC', 'Service level for C', '%')}
          </fieldset>
          <div className="button-row">
            <button type="submit" className="primary">
              Save settings
            </button>
          </div>
          <StatusLines note={message} error={error} />
        </form>
      )}
    </section>
  );
}
