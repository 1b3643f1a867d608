/**
 * Reading an export as a stream of records (csv-parse), each with the physical line it starts on
 * (the header is line 1). Before parsing: the SHA-256 of the bytes, a check of the encoding, and
 * the delimiter sniffed from the header line (the one of comma, semicolon and tab that occurs most
 * often outside quotes).
 */
import { createHash } from 'node:crypto';
import { closeSync, createReadStream, openSync, readSync, statSync } from 'node:fs';
import { parse } from 'csv-parse';

export type Delimiter = ',' | ';' | '\t';

export class FileProblem extends Error {
  constructor(
    message: string,
    readonly line: number | null = null,
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
export function sniffFile(path: string): { delimiter: Delimiter; bom: boolean; sample: string } {
  const buf = head(path);
  if (buf.length === 0) throw new FileProblem('the file is empty (expected a header line and data rows)');
  if ((buf[0] === 0xff && buf[1] === 0xfe) || (buf[0] === 0xfe && buf[1] === 0xff)) {
    throw new FileProblem('the file is UTF-16 encoded; save it as UTF-8 (or "CSV UTF-8") and import again');
  }
  const bom = buf[0] === 0xef && buf[1] === 0xbb && buf[2] === 0xbf;
  const text = buf.toString('utf8', bom ? 3 : 0);
  if (text.includes('\u0000'))
    throw new FileProblem('the file is not text (it holds NUL bytes); export it as CSV');
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
  return { delimiter, bom, sample: text };
}

export interface RecordSink {
  header(cells: string[]): void;
  /** One data record; `line` is the physical line it starts on. */
  row(cells: string[], line: number): void;
}

/** Stream the file through csv-parse, calling the sink for the header and for each non-empty record. */
export async function readRecords(path: string, delimiter: Delimiter, sink: RecordSink): Promise<number> {
  const parser = parse({
    delimiter,
    bom: true,
    info: true,
    relax_column_count: true,
    skip_empty_lines: true,
    trim: true,
  });
  let prevEnd = 0;
  let prevEmpty = 0;
  let first = true;
  let rows = 0;
  const source = createReadStream(path, { highWaterMark: 1 << 18 });
  source.pipe(parser);
  try {
    for await (const item of parser as AsyncIterable<{
      record: string[];
      info: { lines: number; empty_lines: number };
    }>) {
      const { record, info } = item;
      const start = prevEnd + 1 + (info.empty_lines - prevEmpty);
      prevEnd = info.lines;
      prevEmpty = info.empty_lines;
      if (first) {
        first = false;
        sink.header(record);
        continue;
      }
      let empty = true;
      for (let i = 0; i < record.length; i++) if (record[i] !== '') empty = false;
      if (empty) continue;
      rows++;
      sink.row(record, start);
    }
  } catch (err) {
    source.destroy();
    if (err instanceof FileProblem) throw err;
    const e = err as { code?: string; message?: string; lines?: number };
    if (typeof e.code === 'string' && e.code.startsWith('CSV_')) {
      const msg = (e.message ?? '').replace(/ at line \d+/, '');
      throw new FileProblem(`the CSV cannot be read: ${msg}`, e.lines ?? null);
    }
    throw err;
  }
  if (first) throw new FileProblem('the file is empty (expected a header line and data rows)');
  return rows;
}
