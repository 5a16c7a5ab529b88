/**
 * Where each key of a block and its value were written, as hosts look them up
 * (hovers on a key, the species of `system:`). Every cached block of every note
 * has one, and a host asks for the keys of few of them, so they are found on
 * the first request, by reading the body again, and then kept compact: the key
 * names and their four offsets each in one array of its final length, instead
 * of a Map of small span objects. A block has a handful of keys, so a linear
 * search finds one as fast as a hash would; the spans are made on request.
 */
import type { Span } from '../types';
import { entries, parseBody } from './yamlTree';

/** The spans of one key: the key itself and its value. */
export interface KeyAt {
  readonly key: Span;
  readonly value: Span;
}

/** Key name → spans, in the order the keys were written; a later duplicate replaces the earlier one's spans, as `Map.set` does. */
export class KeySpans implements ReadonlyMap<string, KeyAt> {
  /** The body until the keys are first asked for, then null. */
  private body: string | null;
  private readonly keep: (name: string) => string;
  /**
   * Name, key start, key end, value start and value end of each key, in turn, in one
   * array made at its final length (a growing array keeps spare room, and this one is
   * kept for as long as its block); empty until first asked for.
   */
  private found: (string | number)[] = NONE;

  /** The keys of a block body (offsets into it); `keep` gives the string to keep for a name (the schema's own, not the parser's copy). */
  constructor(body: string, keep: (name: string) => string = (name) => name) {
    this.body = body;
    this.keep = keep;
  }

  /** The keys' records, read from the body on the first call. */
  private get data(): (string | number)[] {
    if (this.body !== null) {
      const { doc } = parseBody(this.body);
      this.body = null;
      this.found = doc ? record(entries(doc.contents), this.keep) : NONE;
    }
    return this.found;
  }

  get size(): number {
    return this.data.length / STRIDE;
  }

  has(name: string): boolean {
    return this.find(name) >= 0;
  }

  get(name: string): KeyAt | undefined {
    const i = this.find(name);
    return i < 0 ? undefined : this.at(i);
  }

  forEach(callback: (value: KeyAt, key: string, map: ReadonlyMap<string, KeyAt>) => void, thisArg?: unknown): void {
    for (let i = 0; i < this.data.length; i += STRIDE) callback.call(thisArg, this.at(i), this.data[i] as string, this);
  }

  *entries(): MapIterator<[string, KeyAt]> {
    for (let i = 0; i < this.data.length; i += STRIDE) yield [this.data[i] as string, this.at(i)];
  }

  *keys(): MapIterator<string> {
    for (let i = 0; i < this.data.length; i += STRIDE) yield this.data[i] as string;
  }

  *values(): MapIterator<KeyAt> {
    for (let i = 0; i < this.data.length; i += STRIDE) yield this.at(i);
  }

  [Symbol.iterator](): MapIterator<[string, KeyAt]> {
    return this.entries();
  }

  /** Index in `data` of the name's record, or -1. */
  private find(name: string): number {
    for (let i = 0; i < this.data.length; i += STRIDE) if (this.data[i] === name) return i;
    return -1;
  }

  private at(i: number): KeyAt {
    const d = this.data as number[];
    return { key: { start: d[i + 1]!, end: d[i + 2]! }, value: { start: d[i + 3]!, end: d[i + 4]! } };
  }
}

/** Entries per key in the data array. */
const STRIDE = 5;

const NONE: (string | number)[] = [];

/** The mapping entries a body was read into, as `KeySpans` keeps them. */
interface WrittenKey {
  readonly key: string;
  readonly keySpan: Span;
  readonly valueSpan: Span;
}

function record(written: readonly WrittenKey[], keep: (name: string) => string): (string | number)[] {
  // A Map keeps each name at its first place and the spans of its last entry, as the reader's own map does.
  const last = new Map<string, WrittenKey>();
  for (const w of written) last.set(w.key, w);
  const data = new Array<string | number>(STRIDE * last.size);
  let at = 0;
  for (const [name, w] of last) {
    data[at] = keep(name);
    data[at + 1] = w.keySpan.start;
    data[at + 2] = w.keySpan.end;
    data[at + 3] = w.valueSpan.start;
    data[at + 4] = w.valueSpan.end;
    at += STRIDE;
  }
  return data;
}
