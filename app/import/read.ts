/**
 * Reading an export as a stream of records (csv-parse), each with the physical line it starts on
 * (the header is line 1). Before parsing: the SHA-256 of the bytes, a check of the encoding, and
 * the delimiter sniffed from the header line (the one of comma, semicolon and tab that occurs most
 * often outside quotes).
 */
import { createHash } from 'node:crypto';
import { closeSync, createReadStream, openSync, readSync, statSync } from 'node:fs';
import { CsvError, parse } from 'csv-parse';

export type Delimiter = ',' | ';' | '\t';

export class FileProblem extends Error {
  constructor(
    message: string,
    readonly line: number | null = null,
    /** The CSV syntax itself is broken (csv-parse refused it). */
    readonly syntax = false,
  ) {
    super(message);
    this.name = 'FileProblem';
  }
}

export async function sha256OfFile(path: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of createReadStream(path, { highWaterMark: 1 << 20 })) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

/** First bytes of the file, for sniffing. */
function head(path: string, bytes = 65536): Buffer {
  const fd = openSync(path, 'r');
  try {
    const buf = Buffer.alloc(Math.min(bytes, statSync(path).size));
    const n = readSync(fd, buf, 0, buf.length, 0);
    return buf.subarray(0, n);
  } finally {
    closeSync(fd);
  }
}

/** Refuse encodings we do not read; return the delimiter of the header line. */
export function sniffFile(path: string): {
  delimiter: Delimiter;
  bom: boolean;
  sample: string;
  sepLine: boolean;
} {
  const buf = head(path);
  if (buf.length === 0) throw new FileProblem('the file is empty (expected a header line and data rows)');
  if ((buf[0] === 0xff && buf[1] === 0xfe) || (buf[0] === 0xfe && buf[1] === 0xff)) {
    throw new FileProblem('the file is UTF-16 encoded; save it as UTF-8 (or "CSV UTF-8") and import again');
  }
  const bom = buf[0] === 0xef && buf[1] === 0xbb && buf[2] === 0xbf;
  const text = buf.toString('utf8', bom ? 3 : 0);
  if (text.includes('\u0000'))
    throw new FileProblem('the file is not text (it holds NUL bytes); export it as CSV');
  // A first line "sep=;" (written by some spreadsheet exports) names the delimiter outright.
  const sep = /^sep=([,;\t])\r?\n/i.exec(text);
  if (sep) return { delimiter: sep[1] as Delimiter, bom, sample: text.slice(sep[0].length), sepLine: true };
  const counts: Record<Delimiter, number> = { ',': 0, ';': 0, '\t': 0 };
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (c === '"') quoted = !quoted;
    else if (!quoted && (c === '\n' || c === '\r')) break;
    else if (!quoted && (c === ',' || c === ';' || c === '\t')) counts[c]++;
  }
  let delimiter: Delimiter = ',';
  if (counts[';'] > counts[delimiter]) delimiter = ';';
  if (counts['\t'] > counts[delimiter]) delimiter = '\t';
  return { delimiter, bom, sample: text, sepLine: false };
}

export interface RecordSink {
  /** The header record; `line` is its physical line (1, or 2 after a "sep=" line). */
  header(cells: string[], line: number): void;
  /** One data record; `line` is the physical line it starts on. */
  row(cells: string[], line: number): void;
}

/**
 * Stream the file through csv-parse, calling the sink for the header and for each non-empty record.
 * Line numbers come from the parser's running counters (`parser.info`), read in the synchronous
 * 'data' handler, so they describe the record just emitted; a record's first line is one after the
 * previous record's last line plus the empty lines skipped in between. (The per-record `info`
 * option gives the same numbers at about twice the parsing cost.)
 */
export function readRecords(
  path: string,
  delimiter: Delimiter,
  sink: RecordSink,
  skipSepLine = false,
  trim = false,
): Promise<number> {
  return new Promise<number>((resolve, reject) => {
    const parser = parse({
      delimiter,
      bom: true,
      relax_column_count: true,
      skip_empty_lines: true,
      // Trimming in the parser (spaces around quoted fields) costs about 15% of the parse; our
      // code trims every cell anyway, so it is asked for only when a file needs it.
      trim,
    });
    const counters = parser.info as { lines: number; empty_lines: number; records: number };
    let prevEnd = 0;
    let prevEmpty = 0;
    let first = true;
    let skip = skipSepLine;
    let rows = 0;
    let done = false;
    const source = createReadStream(path, { highWaterMark: 1 << 18 });
    const fail = (err: unknown) => {
      if (done) return;
      done = true;
      source.destroy();
      parser.destroy();
      if (err instanceof FileProblem) return reject(err);
      const e = err as { code?: string; message?: string; lines?: number };
      if (err instanceof CsvError || (typeof e.code === 'string' && e.code.startsWith('CSV_'))) {
        const msg = (e.message ?? '').replace(/ at line \d+/, '');
        return reject(new FileProblem(`the CSV cannot be read: ${msg}`, e.lines ?? null, true));
      }
      reject(err);
    };
    source.on('error', fail);
    parser.on('error', fail);
    parser.on('data', (record: string[]) => {
      if (done) return;
      const start = prevEnd + 1 + (counters.empty_lines - prevEmpty);
      prevEnd = counters.lines;
      prevEmpty = counters.empty_lines;
      try {
        if (skip) {
          skip = false;
          return;
        }
        if (first) {
          first = false;
          sink.header(record, start);
          return;
        }
        let empty = true;
        for (let i = 0; i < record.length; i++) {
          const c = record[i];
          if (c !== '' && c.trim() !== '') {
            empty = false;
            break;
          }
        }
        if (empty) return;
        rows++;
        sink.row(record, start);
      } catch (err) {
        fail(err);
      }
    });
    parser.on('end', () => {
      if (done) return;
      done = true;
      if (first) reject(new FileProblem('the file is empty (expected a header line and data rows)'));
      else resolve(rows);
    });
    source.pipe(parser);
  });
}
