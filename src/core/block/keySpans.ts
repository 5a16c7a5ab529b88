/**
 * Where each key of a block and its value were written, as hosts look them up
 * (hovers on a key, the species of `system:`). It stays in the cache for as
 * long as the block does, for every block of every note, so it is kept
 * compact: the key names in one array and their four offsets each in another,
 * instead of a Map of small span objects. A block has a handful of keys, so a
 * linear search finds one as fast as a hash would; the spans are made on request.
 */
import type { Span } from '../types';

/** The spans of one key: the key itself and its value. */
export interface KeyAt {
  readonly key: Span;
  readonly value: Span;
}

/** Key name → spans, in the order the keys were written; a later duplicate replaces the earlier one's spans, as `Map.set` does. */
export class KeySpans implements ReadonlyMap<string, KeyAt> {
  private readonly names: string[] = [];
  /** Key start, key end, value start and value end of each name, in turn. */
  private readonly offsets: number[] = [];

  /** Records a key (the reader's only writer). */
  add(name: string, key: Span, value: Span): void {
    let i = this.names.indexOf(name);
    if (i < 0) {
      i = this.names.length;
      this.names.push(name);
    }
    this.offsets[4 * i] = key.start;
    this.offsets[4 * i + 1] = key.end;
    this.offsets[4 * i + 2] = value.start;
    this.offsets[4 * i + 3] = value.end;
  }

  get size(): number {
    return this.names.length;
  }

  has(name: string): boolean {
    return this.names.includes(name);
  }

  get(name: string): KeyAt | undefined {
    const i = this.names.indexOf(name);
    return i < 0 ? undefined : this.at(i);
  }

  forEach(callback: (value: KeyAt, key: string, map: ReadonlyMap<string, KeyAt>) => void, thisArg?: unknown): void {
    this.names.forEach((name, i) => callback.call(thisArg, this.at(i), name, this));
  }

  *entries(): MapIterator<[string, KeyAt]> {
    for (let i = 0; i < this.names.length; i++) yield [this.names[i]!, this.at(i)];
  }

  *keys(): MapIterator<string> {
    yield* this.names;
  }

  *values(): MapIterator<KeyAt> {
    for (let i = 0; i < this.names.length; i++) yield this.at(i);
  }

  [Symbol.iterator](): MapIterator<[string, KeyAt]> {
    return this.entries();
  }

  private at(i: number): KeyAt {
    const o = this.offsets;
    return { key: { start: o[4 * i]!, end: o[4 * i + 1]! }, value: { start: o[4 * i + 2]!, end: o[4 * i + 3]! } };
  }
}
