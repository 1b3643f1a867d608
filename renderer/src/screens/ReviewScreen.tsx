/** The review queue: flagged items, worst first, each with its flags in plain words. */
import { useLoad } from '../api-context';
import { FlagList } from '../components/FlagList';
import { StatusLines } from '../components/StatusLines';
import { routeHref } from '../route';

export function ReviewScreen() {
  const queue = useLoad((api) => api.reviewQueue(), []);
  return (
    <section className="pad page" aria-labelledby="review-h">
      <div className="toolbar">
        <h1 id="review-h">Needs review</h1>
        {queue.data && (
          <span className="muted">
            {queue.data.length} flagged items · {queue.data.filter((e) => e.reviewed).length} reviewed
          </span>
        )}
      </div>
      <StatusLines error={queue.error} />
      {queue.data && queue.data.length === 0 && (
        <p className="muted">Nothing to review: no item of the latest run carries a flag (or no run yet).</p>
      )}
      {queue.data && queue.data.length > 0 && (
        <ol className="queue" aria-label="Flagged items, worst first">
          {queue.data.map((e) => (
            <li key={e.sku} className={e.reviewed ? 'queue-item reviewed' : 'queue-item'} data-sku={e.sku}>
              <h2>
                <a href={routeHref('items', e.sku)}>
                  <span className="mono">{e.sku}</span> {e.description}
                </a>
                <span className="muted"> · {e.supplier ?? 'no supplier'}</span>
                {e.reviewed && <span className="tick"> ✓ reviewed</span>}
              </h2>
              <FlagList flags={e.flags} />
            </li>
          ))}
        </ol>
      )}
    </section>
  );
}
