/**
 * Streams CSV records out of a byte or text source: incremental UTF-8 decoding
 * (TextDecoder with `stream: true`, fatal on invalid bytes), BOM removal, line-ending
 * detection, and papaparse's low-level parser fed chunk by chunk. The whole file is
 * never held as one string: only the current chunk and the unfinished last line.
 */
import Papa from 'papaparse';

/** Anything the caller can iterate: a Node Readable, a web ReadableStream, an array of chunks. */
export type CsvSource = AsyncIterable<Uint8Array | string> | Iterable<Uint8Array | string>;

export interface ReadProgress {
  bytesRead: number;
  rowsProcessed: number;
}

/** Called per record with its fields and the 1-based line number where it starts. Return false to stop reading. */
export type RecordSink = (fields: string[], line: number) => boolean | void;

export interface ReadOptions {
  delimiter: string;
  onRecord: RecordSink;
  onProgress?: (p: ReadProgress) => void;
}

export type ReadOutcome =
  | { ok: true; bytesRead: number; records: number; stopped: boolean }
  | { ok: false; code: 'file-binary' | 'file-not-utf8' | 'line-too-long'; line: number; message: string; bytesRead: number };

/** Longest line accepted (1 MiB): a meter export's lines are under 1 KB; a file with no line breaks is not CSV. */
export const MAX_LINE_CHARS = 1_048_576;

interface LowLevelParser {
  parse(input: string, baseIndex: number, ignoreLastRow: boolean): { data: string[][]; meta: { cursor: number } };
}
type LowLevelParserClass = new (config: { delimiter: string; newline: string; quoteChar: string }) => LowLevelParser;
// papaparse exports its chunk-level parser as `Papa.Parser`; its type declarations describe another shape.
const PapaParser = (Papa as unknown as { Parser: LowLevelParserClass }).Parser;

function countNewlines(text: string, end = text.length): number {
  let n = 0;
  let i = text.indexOf('\n');
  while (i !== -1 && i < end) {
    n++;
    i = text.indexOf('\n', i + 1);
  }
  return n;
}

function detectNewline(text: string): '\n' | '\r\n' | '\r' | null {
  const lf = text.indexOf('\n');
  if (lf > 0 && text.charCodeAt(lf - 1) === 13) return '\r\n';
  if (lf !== -1) return '\n';
  const cr = text.indexOf('\r');
  // A CR at the very end may be the first half of a CRLF split across chunks: wait.
  return cr !== -1 && cr < text.length - 1 ? '\r' : null;
}

/**
 * Reads every record of `source`, calling `onRecord` for each. Blank lines are skipped
 * but counted, so line numbers stay those of the file. Stops with a failure on NUL bytes
 * (a binary file) or bytes that are not UTF-8.
 */
export async function readRecords(source: CsvSource, opts: ReadOptions): Promise<ReadOutcome> {
  const decoder = new TextDecoder('utf-8', { fatal: true });
  let parser: LowLevelParser | null = null;
  let pending = '';
  let nextLine = 1;
  let records = 0;
  let bytesRead = 0;
  let first = true;
  let stopped = false;

  const feed = (text: string, last: boolean): boolean => {
    let aggregate = pending + text;
    if (!parser) {
      const nl = detectNewline(aggregate);
      if (nl === null && !last) {
        pending = aggregate;
        return true;
      }
      parser = new PapaParser({ delimiter: opts.delimiter, newline: nl ?? (aggregate.includes('\r') ? '\r' : '\n'), quoteChar: '"' });
    }
    if (aggregate.length === 0) return true;
    const quoted = aggregate.indexOf('"') !== -1;
    const result = parser.parse(aggregate, 0, !last);
    pending = last ? '' : aggregate.slice(result.meta.cursor);
    aggregate = '';
    const rows = result.data;
    for (let r = 0; r < rows.length; r++) {
      const fields = rows[r];
      const line = nextLine;
      nextLine++;
      if (quoted) for (const f of fields) if (f.indexOf('\n') !== -1) nextLine += countNewlines(f);
      if (fields.length === 1 && fields[0].trim() === '') continue;
      records++;
      if (opts.onRecord(fields, line) === false) {
        stopped = true;
        return false;
      }
    }
    return true;
  };

  const failAt = (code: 'file-binary' | 'file-not-utf8', chunkText: string, at: number): ReadOutcome => {
    const line = nextLine + countNewlines(pending) + countNewlines(chunkText, at);
    const message =
      code === 'file-binary'
        ? `Line ${line.toLocaleString('en-US')}: the file contains NUL bytes, so it is not a CSV text file. Export the meter data as CSV and upload that.`
        : `Line ${line.toLocaleString('en-US')}: the file is not valid UTF-8 text. Save or export it as UTF-8 CSV and upload it again.`;
    return { ok: false, code, line, message, bytesRead };
  };

  for await (const chunk of source) {
    let text: string;
    if (typeof chunk === 'string') {
      text = chunk;
      bytesRead += chunk.length;
    } else {
      bytesRead += chunk.byteLength;
      const nul = chunk.indexOf(0);
      if (nul !== -1) return failAt('file-binary', new TextDecoder().decode(chunk.subarray(0, nul)), Infinity);
      try {
        text = decoder.decode(chunk, { stream: true });
      } catch {
        const loose = new TextDecoder().decode(chunk);
        return failAt('file-not-utf8', loose, Math.max(0, loose.indexOf('\uFFFD')));
      }
    }
    if (first && text.length > 0) {
      if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
      first = false;
    }
    if (typeof chunk === 'string') {
      const nul = text.indexOf('\0');
      if (nul !== -1) return failAt('file-binary', text, nul);
    }
    if (!feed(text, false)) break;
    if (pending.length > MAX_LINE_CHARS) {
      return { ok: false, code: 'line-too-long', line: nextLine, bytesRead, message: `Line ${nextLine.toLocaleString('en-US')} is longer than 1 MiB without a line break, so this is not a CSV export of interval data. Check the file.` };
    }
    opts.onProgress?.({ bytesRead, rowsProcessed: records });
  }
  if (!stopped) {
    let tail: string;
    try {
      tail = decoder.decode();
    } catch {
      return failAt('file-not-utf8', '', 0);
    }
    feed(tail, true);
    opts.onProgress?.({ bytesRead, rowsProcessed: records });
  }
  return { ok: true, bytesRead, records, stopped };
}

/** Splits a text into chunks of `size` characters: a helper for tests and callers holding a string already. */
export function* textChunks(text: string, size = 65_536): Generator<string> {
  for (let i = 0; i < text.length; i += size) yield text.slice(i, i + size);
}

/** Adapts a web `ReadableStream` (fetch body, multipart part) to the async iterable the readers take, releasing the lock at the end. */
export async function* fromWebStream(stream: ReadableStream<Uint8Array | string>): AsyncGenerator<Uint8Array | string> {
  const reader = stream.getReader();
  try {
    for (;;) {
      const { done, value } = await reader.read();
      if (done) return;
      yield value;
    }
  } finally {
    reader.releaseLock();
  }
}
