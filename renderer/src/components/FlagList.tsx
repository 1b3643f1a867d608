/**
 * An item's flags in plain words: how serious, what was found, what to do about it, and — when the
 * service reported one — the diagnostic behind the flag.
 */
import type { DiagnosticLine, Flag } from '../../../app/api/contract';
import { dec2 } from '../format';

const SEVERITY_ORDER: Record<Flag['severity'], number> = { critical: 0, warning: 1, info: 2 };
export const SEVERITY_LABEL: Record<Flag['severity'], string> = {
  critical: 'Needs attention',
  warning: 'Check',
  info: 'Note',
};

/** Flags worst first; equal severity keeps the service's order. */
export function sortFlags(flags: Flag[]): Flag[] {
  return flags
    .map((f, i) => ({ f, i }))
    .sort((a, b) => SEVERITY_ORDER[a.f.severity] - SEVERITY_ORDER[b.f.severity] || a.i - b.i)
    .map((x) => x.f);
}

export function FlagList({ flags, diagnostics = [] }: { flags: Flag[]; diagnostics?: DiagnosticLine[] }) {
  if (flags.length === 0) return <p className="muted">No flags: the checks found nothing to review.</p>;
  return (
    <ul className="flags" aria-label="Flags">
      {sortFlags(flags).map((f) => {
        const behind = diagnostics.filter((d) => d.flagCode === f.code);
        return (
          <li key={f.code} className={`flag sev-${f.severity}`}>
            <span className={`sev sev-${f.severity}`}>{SEVERITY_LABEL[f.severity]}</span>
            <span className="flag-reason">{f.reason}</span>
            <span className="flag-action">What to do: {f.action}</span>
            {behind.length > 0 && (
              <span className="flag-diag">
                {behind.map((d) => (
                  <span key={d.name}>
                    {d.name}
                    {d.value !== null && ` = ${dec2(d.value)}`}
                    {d.pValue !== null && `, p = ${d.pValue < 0.001 ? '< 0.001' : dec2(d.pValue)}`}
                    {d.text && ` — ${d.text}`}
                  </span>
                ))}
              </span>
            )}
          </li>
        );
      })}
    </ul>
  );
}
