/**
 * One item opened: its settings and stock, the forecast chart, the residual checks, the candidate
 * models, the flags with their diagnostics, the order line with its explanation, the decisions and
 * the item's audit trail. Everything shown was computed by the service.
 */
import { useState } from 'react';
import type { Decision } from '../../../app/api/contract';
import { useApi, useLoad } from '../api-context';
import { AcfChart, ForecastChart, RootsChart } from '../charts';
import { FlagList } from '../components/FlagList';
import { StatusLines } from '../components/StatusLines';
import { WhenVisible } from '../components/WhenVisible';
import { dec1, serviceLabel, units } from '../format';
import { fetchItem } from '../item-cache';
import { DecisionPanel } from './DecisionPanel';

export function ItemDetailPanel({ sku }: { sku: string }) {
  const { api, changed, version } = useApi();
  const item = useLoad((a) => fetchItem(a, version, sku), [sku]);
  const [message, setMessage] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);

  if (item.error)
    return (
      <p className="error pad" role="alert">
        {item.error}
      </p>
    );
  if (!item.data) return <p className="muted pad">Loading {sku}…</p>;
  const d = item.data;
  const s = d.settings;
  const r = d.result;
  const o = r?.order ?? null;

  const decide = async (decision: Decision) => {
    setError(null);
    try {
      await api.decide(sku, decision);
      setMessage('Saved to the audit log; the next run will use it.');
      changed();
    } catch (e) {
      setError(e instanceof Error ? e.message : String(e));
    }
  };

  return (
    <article className="item-detail" aria-labelledby="item-title" data-testid="item-detail" data-sku={sku}>
      <header className="item-head">
        <h2 id="item-title">
          <span className="mono">{s.sku}</span> {s.description}
        </h2>
        <p className="muted">
          {s.supplier ?? 'no supplier'} · lead time {dec1(s.leadTimeWeeks)} weeks
          {s.leadTimeSdWeeks > 0 ? ` (± ${dec1(s.leadTimeSdWeeks)})` : ''} ·{' '}
          {s.reviewPeriodWeeks === 0
            ? 'continuous review'
            : s.reviewPeriodWeeks === 1
              ? 'weekly review'
              : `review every ${s.reviewPeriodWeeks} weeks`}{' '}
          · case pack {units(s.casePack)} · MOQ {units(s.moq)}
          {s.serviceLevel !== null ? ` · target ${serviceLabel(s.serviceLevel, s.serviceKind)}` : ''}
          {s.shelfLifeWeeks ? ` · shelf life ${s.shelfLifeWeeks} weeks` : ''}
          {d.reviewed ? ' · ✓ reviewed' : ''}
        </p>
        {d.position && (
          <p className="muted">
            On hand {units(d.position.onHand)} · on order {units(d.position.onOrder)} · backorders{' '}
            {units(d.position.backorders)}
            {d.position.asOf ? ` (as of ${d.position.asOf})` : ''}
          </p>
        )}
      </header>
      <StatusLines note={message} error={error} />

      {!r ? (
        <p className="note">Not planned yet: start a run to see the forecast and the order line.</p>
      ) : (
        <>
          <section aria-labelledby="fc-h">
            <h3 id="fc-h">
              Forecast · <span className="mono">{r.model.label}</span>
            </h3>
            <ForecastChart
              weeks={d.history.weekStart}
              history={d.history.qty}
              fitted={r.fitted}
              forecast={r.forecast}
              reorderPoint={o?.reorderPoint ?? null}
              orderUpTo={o?.orderUpTo ?? null}
            />
            {r.overridesApplied.length > 0 && (
              <ul className="plain applied" aria-label="Decisions this run respected">
                {r.overridesApplied.map((t) => (
                  <li key={t}>Respected: {t}</li>
                ))}
              </ul>
            )}
          </section>

          <section aria-labelledby="order-h">
            <h3 id="order-h">Order suggestion</h3>
            {o ? (
              <>
                <dl className="facts">
                  <dt>Order now</dt>
                  <dd className="big">
                    {units(o.orderQty)} units{o.casePacks > 0 ? ` (${units(o.casePacks)} case packs)` : ''}
                    {o.edit ? ` — edited from ${units(o.suggestedQty)}` : ''}
                  </dd>
                  <dt>Reorder point</dt>
                  <dd>{units(o.reorderPoint)}</dd>
                  <dt>Order-up-to level</dt>
                  <dd>{units(o.orderUpTo)}</dd>
                  <dt>Safety stock</dt>
                  <dd>{units(o.safetyStock)}</dd>
                  <dt>Demand over the interval</dt>
                  <dd>
                    {units(o.intervalForecast)} ± {units(o.intervalSd)} (one standard deviation)
                  </dd>
                  <dt>Service target</dt>
                  <dd>{serviceLabel(o.serviceLevel, o.serviceKind)}</dd>
                </dl>
                <ul className="plain explanation" aria-label="How the order was worked out">
                  {o.explanation.map((t) => (
                    <li key={t}>{t}</li>
                  ))}
                </ul>
              </>
            ) : (
              <p className="muted">No order line for this item.</p>
            )}
          </section>

          <section aria-labelledby="flags-h">
            <h3 id="flags-h">Flags and the checks behind them</h3>
            <FlagList flags={r.flags} diagnostics={r.diagnostics} />
            {r.diagnostics.filter((x) => !x.flagCode).length > 0 && (
              <ul className="plain">
                {r.diagnostics
                  .filter((x) => !x.flagCode)
                  .map((x) => (
                    <li key={x.name}>
                      {x.name}
                      {x.value !== null && ` = ${x.value.toFixed(3)}`}
                      {x.pValue !== null && `, p = ${x.pValue.toFixed(3)}`} {x.text && `— ${x.text}`}
                    </li>
                  ))}
              </ul>
            )}
          </section>

          <div className="two-col">
            <section aria-labelledby="acf-h">
              <h3 id="acf-h">Residual autocorrelation</h3>
              <WhenVisible minHeight={220}>
                <AcfChart acf={r.residualAcf} band={r.acfBand} />
              </WhenVisible>
            </section>
            <section aria-labelledby="roots-h">
              <h3 id="roots-h">AR and MA roots</h3>
              <WhenVisible minHeight={280}>
                <RootsChart ar={r.arRoots} ma={r.maRoots} />
              </WhenVisible>
            </section>
          </div>

          <section aria-labelledby="cand-h">
            <h3 id="cand-h">Candidate models</h3>
            <table className="table compact">
              <thead>
                <tr>
                  <th scope="col">Model</th>
                  <th scope="col" className="num">
                    AICc
                  </th>
                  <th scope="col">Chosen</th>
                </tr>
              </thead>
              <tbody>
                {r.candidates.map((c) => (
                  <tr key={c.label} className={c.chosen ? 'selected' : undefined}>
                    <td className="mono">{c.label}</td>
                    <td className="num">{c.aicc === null ? '–' : c.aicc.toFixed(1)}</td>
                    <td>{c.chosen ? 'yes' : ''}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </section>
        </>
      )}

      <section aria-labelledby="dec-h">
        <h3 id="dec-h">Decide</h3>
        <DecisionPanel key={sku} detail={d} decide={decide} />
      </section>

      <section aria-labelledby="audit-h">
        <h3 id="audit-h">History of decisions</h3>
        {d.audit.length === 0 ? (
          <p className="muted">No decisions on this item yet.</p>
        ) : (
          <ul className="plain audit">
            {d.audit.map((a) => (
              <li key={`${a.at}-${a.action}-${a.detail}`}>
                <time>{a.at.replace('T', ' ').slice(0, 16)}</time> {a.action}: {a.detail}
                {a.reason ? ` — “${a.reason}”` : ''}
              </li>
            ))}
          </ul>
        )}
      </section>
    </article>
  );
}
