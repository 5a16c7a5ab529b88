/**
 * What the e2e tests check on disk: files the editor writes into the served
 * workspace (waited for by watching their folder, never by sleeping), PNG
 * images read down to their pixels' size, and CSV text split into cells.
 */
import { readFileSync, watch } from 'node:fs';
import { dirname } from 'node:path';
import { inflateSync } from 'node:zlib';

/**
 * Waits until `file` exists and `complete` accepts its bytes, re-reading it on
 * every change the kernel reports in its folder; returns the bytes. The
 * timeout is a deadline for a clear failure, not a pause.
 */
export function waitForFile(file: string, complete: (bytes: Buffer) => boolean, timeout = 30000): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    let last = 'no such file';
    let done = false;
    const finish = (): void => {
      done = true;
      watcher.close();
      clearTimeout(timer);
    };
    const check = (): void => {
      if (done) return;
      let bytes: Buffer;
      try {
        bytes = readFileSync(file);
      } catch {
        return;
      }
      last = `${bytes.length} bytes`;
      if (!complete(bytes)) return;
      finish();
      resolve(bytes);
    };
    const watcher = watch(dirname(file), check);
    const timer = setTimeout(() => {
      finish();
      reject(new Error(`${file} was not written completely within ${timeout} ms (last seen: ${last})`));
    }, timeout);
    check();
  });
}

const SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
const IEND = Buffer.from([0, 0, 0, 0, 0x49, 0x45, 0x4e, 0x44, 0xae, 0x42, 0x60, 0x82]);

/** True when the bytes start with the PNG signature and end with the IEND chunk (a whole file). */
export function isWholePng(bytes: Buffer): boolean {
  return (
    bytes.length > SIGNATURE.length + IEND.length &&
    bytes.subarray(0, 8).equals(SIGNATURE) &&
    bytes.subarray(-12).equals(IEND)
  );
}

/** What a PNG file says about itself, read from its chunks. */
export interface PngFacts {
  readonly width: number;
  readonly height: number;
  readonly bitDepth: number;
  readonly colourType: number;
  /** Bytes of the decompressed image data (scanlines with their filter bytes). */
  readonly pixelBytes: number;
  /** Distinct byte values in the decompressed data: 1 or 2 would mean a blank image. */
  readonly distinctBytes: number;
}

/**
 * Reads a PNG: checks the signature, that IHDR comes first, that every
 * chunk fits in the file, and inflates the IDAT chunks; throws on anything
 * that is not a well-formed PNG.
 */
export function pngFacts(bytes: Buffer): PngFacts {
  if (!bytes.subarray(0, 8).equals(SIGNATURE)) throw new Error('no PNG signature');
  let at = 8;
  let ihdr: Buffer | null = null;
  const idat: Buffer[] = [];
  let ended = false;
  while (at + 12 <= bytes.length) {
    const length = bytes.readUInt32BE(at);
    const type = bytes.toString('latin1', at + 4, at + 8);
    if (at + 12 + length > bytes.length) throw new Error(`chunk ${type} runs past the end of the file`);
    const data = bytes.subarray(at + 8, at + 8 + length);
    if (ihdr === null && type !== 'IHDR') throw new Error(`the first chunk is ${type}, not IHDR`);
    if (type === 'IHDR') ihdr = data;
    if (type === 'IDAT') idat.push(data);
    at += 12 + length;
    if (type === 'IEND') {
      ended = true;
      break;
    }
  }
  if (!ihdr || !ended) throw new Error('the file lacks IHDR or IEND');
  const pixels = inflateSync(Buffer.concat(idat));
  const distinct = new Set<number>();
  for (let i = 0; i < pixels.length && distinct.size < 256; i += 7) distinct.add(pixels[i]!);
  return {
    width: ihdr.readUInt32BE(0),
    height: ihdr.readUInt32BE(4),
    bitDepth: ihdr[8]!,
    colourType: ihdr[9]!,
    pixelBytes: pixels.length,
    distinctBytes: distinct.size,
  };
}

/** Splits CSV text (RFC 4180: quoted cells, doubled quotes, CRLF or LF line ends) into rows of cells. */
export function parseCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let cell = '';
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i]!;
    if (quoted) {
      if (c === '"' && text[i + 1] === '"') {
        cell += '"';
        i++;
      } else if (c === '"') quoted = false;
      else cell += c;
    } else if (c === '"') quoted = true;
    else if (c === ',') {
      row.push(cell);
      cell = '';
    } else if (c === '\n' || c === '\r') {
      if (c === '\r' && text[i + 1] === '\n') i++;
      row.push(cell);
      rows.push(row);
      row = [];
      cell = '';
    } else cell += c;
  }
  if (cell !== '' || row.length > 0) rows.push([...row, cell]);
  return rows;
}

/** CSV rows as records keyed by the header row's names. */
export function csvRecords(rows: readonly string[][]): Record<string, string>[] {
  const [head, ...body] = rows;
  if (!head) return [];
  return body.map((r) => Object.fromEntries(head.map((h, i) => [h, r[i] ?? ''])));
}
