/**
 * The content-addressed file store: DATA_DIR/files/<sha256>. Uploads stream to a temporary
 * file while being hashed, then move into place; the same bytes are stored once.
 */
import { createHash, randomBytes } from 'node:crypto';
import { createReadStream, createWriteStream, existsSync, mkdirSync } from 'node:fs';
import { readdir, rename, rm, stat } from 'node:fs/promises';
import { join } from 'node:path';
import type { Readable } from 'node:stream';
import { getConfig } from '../config';

const filesDir = () => join(getConfig().DATA_DIR, 'files');
const tmpDir = () => join(getConfig().DATA_DIR, 'tmp');

export type Received = { tmpPath: string; sha256: string; bytes: number; head: Buffer; truncated: boolean };

/**
 * Streams `source` to a temporary file, hashing as it goes and keeping the first `headBytes`
 * (for magic-byte checks and the mapping preview). Stops with `truncated` past `maxBytes`.
 */
export async function receiveToTemp(source: Readable, maxBytes: number, headBytes = 64 * 1024): Promise<Received> {
  mkdirSync(tmpDir(), { recursive: true });
  const tmpPath = join(tmpDir(), `${Date.now()}-${randomBytes(6).toString('hex')}.part`);
  const out = createWriteStream(tmpPath);
  const hash = createHash('sha256');
  const headParts: Buffer[] = [];
  let headLen = 0;
  let bytes = 0;
  let truncated = false;
  try {
    for await (const chunk of source as AsyncIterable<Buffer>) {
      bytes += chunk.length;
      if (bytes > maxBytes) {
        truncated = true;
        source.resume();
        break;
      }
      hash.update(chunk);
      if (headLen < headBytes) {
        headParts.push(chunk.subarray(0, headBytes - headLen));
        headLen += Math.min(chunk.length, headBytes - headLen);
      }
      if (!out.write(chunk)) await new Promise<void>((r) => out.once('drain', () => r()));
    }
  } finally {
    await new Promise<void>((resolve, reject) => out.end((err?: Error | null) => (err ? reject(err) : resolve())));
  }
  if (truncated) await rm(tmpPath, { force: true });
  return { tmpPath, sha256: hash.digest('hex'), bytes, head: Buffer.concat(headParts), truncated };
}

/** Moves a received file into the store under its hash (keeping an existing copy). */
export async function commitToStore(received: Received): Promise<string> {
  mkdirSync(filesDir(), { recursive: true });
  const dest = join(filesDir(), received.sha256);
  if (existsSync(dest)) await rm(received.tmpPath, { force: true });
  else await rename(received.tmpPath, dest);
  return dest;
}

export async function discardTemp(received: Pick<Received, 'tmpPath'>): Promise<void> {
  await rm(received.tmpPath, { force: true });
}

export function storedPath(sha256: string): string {
  if (!/^[0-9a-f]{64}$/.test(sha256)) throw new Error('not a sha256');
  return join(filesDir(), sha256);
}

export function openStored(sha256: string): Readable {
  return createReadStream(storedPath(sha256), { highWaterMark: 256 * 1024 });
}

export async function storedSize(sha256: string): Promise<number | null> {
  try {
    return (await stat(storedPath(sha256))).size;
  } catch {
    return null;
  }
}

/**
 * Removes upload temp files a stopped server left behind (a kill mid-upload). Only files older
 * than `minAgeMs` go, so an upload another instance sharing DATA_DIR is receiving is untouched.
 * Returns how many were removed.
 */
export async function sweepTemp(minAgeMs = 60 * 60_000, now = Date.now()): Promise<number> {
  let removed = 0;
  let names: string[];
  try {
    names = await readdir(tmpDir());
  } catch {
    return 0;
  }
  for (const name of names) {
    if (!name.endsWith('.part')) continue;
    const p = join(tmpDir(), name);
    try {
      if (now - (await stat(p)).mtimeMs >= minAgeMs) {
        await rm(p, { force: true });
        removed++;
      }
    } catch {
      /* gone already */
    }
  }
  return removed;
}
