/** Streaming: chunk boundaries, BOM, CRLF, multi-byte characters, progress, binary and non-UTF-8 input. */
import { describe, expect, it } from 'vitest';
import { fromWebStream, readRecords } from '@/lib/import/records';

const enc = new TextEncoder();

async function collect(chunks: (Uint8Array | string)[]) {
  const rows: [string[], number][] = [];
  const progress: number[] = [];
  const outcome = await readRecords(chunks, { delimiter: ',', onRecord: (f, line) => void rows.push([f, line]), onProgress: (p) => progress.push(p.bytesRead) });
  return { rows, outcome, progress };
}

function split(bytes: Uint8Array, at: number[]): Uint8Array[] {
  const out: Uint8Array[] = [];
  let from = 0;
  for (const a of [...at, bytes.length]) {
    out.push(bytes.subarray(from, a));
    from = a;
  }
  return out;
}

describe('readRecords', () => {
  it('strips a UTF-8 BOM split across two chunks (RFC 3629 section 6)', async () => {
    const bytes = enc.encode('\uFEFFa,b\n1,2\n');
    const { rows } = await collect(split(bytes, [1, 2]));
    expect(rows).toEqual([[['a', 'b'], 1], [['1', '2'], 2]]);
  });

  it('keeps a multi-byte character split across chunks', async () => {
    const bytes = enc.encode('Zähler,kWh\n1,2\n');
    const { rows } = await collect(split(bytes, [2]));
    expect(rows[0][0]).toEqual(['Zähler', 'kWh']);
  });

  it('handles CRLF with the pair split across chunks (RFC 4180 line breaks)', async () => {
    const bytes = enc.encode('a,b\r\n1,2\r\n3,4\r\n');
    const { rows } = await collect(split(bytes, [4, 9]));
    expect(rows.map((r) => r[0])).toEqual([['a', 'b'], ['1', '2'], ['3', '4']]);
  });

  it('counts lines of quoted fields with embedded newlines and blank lines (RFC 4180 section 2.6)', async () => {
    const { rows } = await collect(['h1,h2\n"multi\nline",x\n\n5,6\n']);
    expect(rows.map((r) => r[1])).toEqual([1, 2, 5]);
  });

  it('reports progress after each chunk and the bytes read in all', async () => {
    const bytes = enc.encode('a,b\n1,2\n3,4\n');
    const { outcome, progress } = await collect(split(bytes, [5, 9]));
    expect(progress).toEqual([5, 9, 12, 12]);
    expect(outcome).toMatchObject({ ok: true, bytesRead: 12, records: 3 });
  });

  it('stops on NUL bytes with the line', async () => {
    const { outcome } = await collect([enc.encode('a,b\n1,2\n'), new Uint8Array([0x33, 0x00, 0x0a])]);
    expect(outcome).toMatchObject({ ok: false, code: 'file-binary', line: 3 });
  });

  it('stops on bytes that are not UTF-8, with the line', async () => {
    const { outcome } = await collect([enc.encode('a,b\n1,2\n'), new Uint8Array([0x5a, 0xe4, 0x0a])]);
    expect(outcome).toMatchObject({ ok: false, code: 'file-not-utf8', line: 3 });
  });

  it('stops on a multi-byte sequence cut off at the end of the file', async () => {
    const { outcome } = await collect([new Uint8Array([0x61, 0x2c, 0x62, 0x0a, 0xc3])]);
    expect(outcome).toMatchObject({ ok: false, code: 'file-not-utf8' });
  });

  it('reads string chunks too', async () => {
    const { rows } = await collect(['a,', 'b\n1', ',2']);
    expect(rows.map((r) => r[0])).toEqual([['a', 'b'], ['1', '2']]);
  });

  it('stops when the sink says so', async () => {
    let seen = 0;
    const outcome = await readRecords(['a\nb\nc\n'], { delimiter: ',', onRecord: () => ++seen < 2 });
    expect(seen).toBe(2);
    expect(outcome).toMatchObject({ ok: true, stopped: true });
  });
});

describe('readRecords on a file with no line breaks', () => {
  it('gives up after 1 MiB instead of holding the whole file', async () => {
    const chunk = new Uint8Array(65_536).fill(0x31);
    let sent = 0;
    async function* endless() {
      while (sent < 200) {
        sent++;
        yield chunk;
      }
    }
    const outcome = await readRecords(endless(), { delimiter: ',', onRecord: () => undefined });
    expect(outcome).toMatchObject({ ok: false, code: 'line-too-long', line: 1 });
    expect(sent).toBeLessThan(20);
  });
});

describe('fromWebStream', () => {
  it('reads a web ReadableStream chunk by chunk', async () => {
    const parts = [enc.encode('a,b\n1,'), enc.encode('2\n')];
    const stream = new ReadableStream<Uint8Array>({
      start(c) {
        for (const p of parts) c.enqueue(p);
        c.close();
      },
    });
    const rows: string[][] = [];
    const outcome = await readRecords(fromWebStream(stream), { delimiter: ',', onRecord: (f) => void rows.push(f) });
    expect(rows).toEqual([['a', 'b'], ['1', '2']]);
    expect(outcome).toMatchObject({ ok: true, bytesRead: 8 });
  });
});
