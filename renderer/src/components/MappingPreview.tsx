/**
 * The first rows of a file to import with the detected column mapping above them: each column
 * header has a choice of the field it fills (or none), and every validation problem is listed with
 * its line number in the file (the header is line 1).
 */
import type { ImportPreview } from '../../../app/api/contract';

export const UNUSED = 'ignore';

export function MappingPreview(props: {
  preview: ImportPreview;
  onMappingChange: (mapping: Record<string, string>) => void;
}) {
  const { preview } = props;
  const used = new Set(Object.values(preview.mapping).filter((f) => f !== UNUSED));
  const change = (column: string, field: string) => {
    const next: Record<string, string> = {};
    for (const h of preview.header) next[h] = preview.mapping[h] ?? UNUSED;
    // A field fills one column: taking it for this column frees it elsewhere.
    if (field !== UNUSED) for (const h of preview.header) if (next[h] === field) next[h] = UNUSED;
    next[column] = field;
    props.onMappingChange(next);
  };

  return (
    <div className="mapping">
      <div className="table-scroll">
        <table className="table compact" aria-label="First rows of the file with the column mapping">
          <thead>
            <tr>
              <th scope="col">Line</th>
              {preview.header.map((h) => (
                <th scope="col" key={h}>
                  <div className="col-name">{h}</div>
                  <label>
                    <span className="visually-hidden">Field for column {h}</span>
                    <select
                      value={preview.mapping[h] ?? UNUSED}
                      onChange={(e) => change(h, e.target.value)}
                      data-column={h}
                    >
                      <option value={UNUSED}>(not used)</option>
                      {preview.fields.map((f) => (
                        <option key={f} value={f}>
                          {f}
                          {used.has(f) && preview.mapping[h] !== f ? ' (in use)' : ''}
                        </option>
                      ))}
                    </select>
                  </label>
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {preview.rows.map((row, i) => (
              // biome-ignore lint/suspicious/noArrayIndexKey: rows of a file preview have no identity but their place
              <tr key={i}>
                <td className="num muted">{preview.rowLines[i] ?? ''}</td>
                {preview.header.map((h, j) => (
                  <td key={h}>{row[j] ?? ''}</td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p className="muted" data-testid="import-summary">
        {preview.rowsRead} data rows, {preview.items} items, {preview.weeks} weeks · read as{' '}
        {preview.format.delimiter === '\t' ? 'tab' : `“${preview.format.delimiter}”`}-separated, decimal mark
        “{preview.format.decimal}”{preview.format.dateOrder ? `, dates ${preview.format.dateOrder}` : ''}.
        {preview.unknownSkus.length > 0 && ` ${preview.unknownSkus.length} SKUs are new to the store.`}
      </p>
      {preview.alreadyImported && (
        <p className="note">
          This exact file was already imported on {preview.alreadyImported.at.slice(0, 10)}.
        </p>
      )}
      {preview.warnings.length > 0 && (
        <ul className="plain warnings" aria-label="Warnings">
          {preview.warnings.map((w) => (
            <li key={w}>{w}</li>
          ))}
        </ul>
      )}
      {preview.totalProblems > 0 ? (
        <div className="problems" role="alert">
          <h3>
            {preview.totalProblems} problem{preview.totalProblems === 1 ? '' : 's'} — nothing will be imported
            until they are fixed
          </h3>
          <ul className="plain" aria-label="Problems">
            {preview.problems.map((p) => (
              <li key={`${p.line}-${p.column}-${p.message}`}>{p.message}</li>
            ))}
          </ul>
          {preview.totalProblems > preview.problems.length && (
            <p className="muted">…and {preview.totalProblems - preview.problems.length} more.</p>
          )}
        </div>
      ) : (
        <p className="ok">No problems found.</p>
      )}
    </div>
  );
}
