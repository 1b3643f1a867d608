/**
 * Import this week's export: pick or drop a file, see the first rows with the detected mapping,
 * change it if needed, see every problem, confirm. The service writes nothing when anything is wrong.
 */
import { type DragEvent, useState } from 'react';
import type { ImportKind, ImportOutcome, ImportPreview, ImportRequest } from '../../../app/api/contract';
import { useApi } from '../api-context';
import { MappingPreview } from '../components/MappingPreview';
import { StatusLines } from '../components/StatusLines';

const KINDS: { kind: ImportKind; label: string }[] = [
  { kind: 'sales', label: 'Weekly sales' },
  { kind: 'items', label: 'Item master' },
  { kind: 'stock', label: 'Stock positions' },
];

export function ImportScreen() {
  const { api, changed } = useApi();
  const [kind, setKind] = useState<ImportKind>('sales');
  const [file, setFile] = useState<{ name: string; content: string } | null>(null);
  const [mapping, setMapping] = useState<Record<string, string>>({});
  const [dateOrder, setDateOrder] = useState<'dmy' | 'mdy' | null>(null);
  const [preview, setPreview] = useState<ImportPreview | null>(null);
  const [outcome, setOutcome] = useState<ImportOutcome | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [over, setOver] = useState(false);

  const request = (
    f: { name: string; content: string },
    m: Record<string, string>,
    k = kind,
    d = dateOrder,
    force = false,
  ): ImportRequest => ({ kind: k, fileName: f.name, content: f.content, mapping: m, dateOrder: d, force });

  const runPreview = async (
    f: { name: string; content: string },
    m: Record<string, string>,
    k = kind,
    d = dateOrder,
  ) => {
    setBusy(true);
    setError(null);
    setOutcome(null);
    try {
      const p = await api.previewImport(request(f, m, k, d));
      setPreview(p);
      setMapping(p.mapping);
    } catch (e) {
      setPreview(null);
      setError(e instanceof Error ? e.message : String(e));
    } finally {
      setBusy(false);
    }
  };

  const take = async (f: File | undefined) => {
    if (!f) return;
    const picked = { name: f.name, content: await f.text() };
    setFile(picked);
    setMapping({});
    await runPreview(picked, {});
  };

  const confirm = async (force = false) => {
    if (!file) return;
    setBusy(true);
    setError(null);
    try {
      const o = await api.commitImport(request(file, mapping, kind, dateOrder, force));
      setOutcome(o);
      if (o.status === 'imported') changed();
    } catch (e) {
      setError(e instanceof Error ? e.message : String(e));
    } finally {
      setBusy(false);
    }
  };

  const onDrop = (e: DragEvent) => {
    e.preventDefault();
    setOver(false);
    take(e.dataTransfer.files[0]);
  };

  return (
    <section className="pad page" aria-labelledby="import-h">
      <div className="toolbar">
        <h1 id="import-h">Import</h1>
      </div>
      <div className="form-row">
        <label>
          Kind of file
          <select
            value={kind}
            onChange={(e) => {
              const k = e.target.value as ImportKind;
              setKind(k);
              if (file) runPreview(file, {}, k);
            }}
          >
            {KINDS.map((k) => (
              <option key={k.kind} value={k.kind}>
                {k.label}
              </option>
            ))}
          </select>
        </label>
        <label>
          Dates written
          <select
            value={dateOrder ?? ''}
            onChange={(e) => {
              const d = (e.target.value || null) as 'dmy' | 'mdy' | null;
              setDateOrder(d);
              if (file) runPreview(file, mapping, kind, d);
            }}
          >
            <option value="">detect (ISO first)</option>
            <option value="dmy">day/month/year</option>
            <option value="mdy">month/day/year</option>
          </select>
        </label>
      </div>
      {/* biome-ignore lint/a11y/noStaticElementInteractions: the drop zone is an extra; the file button inside is the keyboard path */}
      <div
        className={over ? 'dropzone over' : 'dropzone'}
        onDragOver={(e) => {
          e.preventDefault();
          setOver(true);
        }}
        onDragLeave={() => setOver(false)}
        onDrop={onDrop}
      >
        <label className="file-pick">
          Choose a CSV file
          <input type="file" accept=".csv,.txt,text/csv" onChange={(e) => take(e.target.files?.[0])} />
        </label>
        <span className="muted"> or drop it here.</span>
        {file && (
          <span>
            {' '}
            File: <strong>{file.name}</strong>
          </span>
        )}
      </div>
      {busy && (
        <p className="muted" role="status">
          Reading…
        </p>
      )}
      <StatusLines error={error} />
      {preview && file && (
        <>
          <MappingPreview preview={preview} onMappingChange={(m) => runPreview(file, m)} />
          <div className="button-row">
            <button
              type="button"
              className="primary"
              disabled={busy || preview.totalProblems > 0}
              onClick={() => confirm(false)}
            >
              Import {preview.rowsRead} rows
            </button>
          </div>
        </>
      )}
      {outcome && (
        <div
          className={outcome.status === 'imported' ? 'note ok' : 'note'}
          role="status"
          data-testid="import-outcome"
        >
          {outcome.status === 'imported' &&
            `Imported: ${outcome.rowsRead} rows, ${outcome.items} items, ${outcome.weeks} weeks.`}
          {outcome.status === 'skipped' && (
            <>
              This exact file was imported before; nothing was changed.{' '}
              <button type="button" className="link" onClick={() => confirm(true)}>
                Import it again anyway
              </button>
            </>
          )}
          {outcome.status === 'rejected' && (
            <>
              Rejected; nothing was written.
              <ul className="plain">
                {outcome.errors.map((p) => (
                  <li key={`${p.line}-${p.column}-${p.message}`}>{p.message}</li>
                ))}
              </ul>
            </>
          )}
          {outcome.warnings.length > 0 && (
            <ul className="plain">
              {outcome.warnings.map((w) => (
                <li key={w}>{w}</li>
              ))}
            </ul>
          )}
        </div>
      )}
    </section>
  );
}
