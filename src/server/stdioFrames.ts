/**
 * The standard streams of the server started with `--stdio`, guarded at the
 * byte level, below JSON-RPC:
 *
 * - Input: only whole frames (`Content-Length: <n>` headers, then `n` bytes)
 *   reach the protocol's reader. A header it cannot read (no or a malformed
 *   length, a line without `:`, lines ended by a bare `\n`, a header block
 *   longer than any real one, a length past what a message can be) is
 *   skipped up to the next `Content-Length:` and said in the log. Without
 *   this, vscode-jsonrpc's reader stays out of step after one such header
 *   (it reads each following body as the start of the next header) and the
 *   server answers nothing more while it keeps running: to the editor, a
 *   hang.
 * - Output: the protocol's writer is the only one to write to the real
 *   standard output; anything else in the process that writes there (a
 *   library's `console.debug`, a `DEBUG_FD=1` debug log) goes to standard
 *   error instead, where it cannot break a frame.
 */
import { constants } from 'node:buffer';
import { Transform, Writable, type TransformCallback } from 'node:stream';

/** Longest header block read (LSP's two fields take under 100 bytes); a longer one is skipped. */
export const MAX_HEADER_BYTES = 4096;

/** Largest body taken: the longest string the engine can make of it (JSON.parse needs the body as one string). */
export const MAX_BODY_BYTES = constants.MAX_STRING_LENGTH;

const CRLFCRLF = Buffer.from('\r\n\r\n', 'latin1');
const LENGTH_FIELD = 'content-length:';
/** A header line: a field name of token characters, `:`, a value without line breaks. */
const HEADER_LINE = /^([!#$%&'*+.^_`|~0-9A-Za-z-]+):[ \t]*([^\r\n]*?)[ \t]*$/;

/** Why a header block cannot be read, or its body's length. */
function bodyLength(head: string): number | string {
  let length: number | null = null;
  for (const line of head.split('\r\n')) {
    const m = HEADER_LINE.exec(line);
    if (!m) return 'a header line is not `Name: value` ended by \\r\\n';
    if (m[1]!.toLowerCase() !== 'content-length') continue;
    if (length !== null) return 'Content-Length is given twice';
    if (!/^\d{1,16}$/.test(m[2]!)) return `Content-Length is not a whole number of bytes`;
    length = Number(m[2]);
    if (length > MAX_BODY_BYTES) return `Content-Length ${length} is more than a message can be`;
  }
  return length ?? 'the header has no Content-Length';
}

/**
 * Passes whole frames on (each as `Content-Length: <n>\r\n\r\n` and its body), skipping what is not one; `skipped`
 * is told how many bytes were skipped and why.
 */
export class FrameGuard extends Transform {
  /** Bytes of the header being read. */
  private head: Buffer = Buffer.alloc(0);
  /** Bytes of the current body still to pass on; -1 while a header is read. */
  private remaining = -1;

  constructor(private readonly skipped: (bytes: number, why: string) => void) {
    super();
  }

  override _transform(chunk: Buffer, _encoding: BufferEncoding, done: TransformCallback): void {
    let data = chunk;
    while (data.length > 0) {
      if (this.remaining >= 0) {
        // A body streams through as it comes, however long.
        const n = Math.min(this.remaining, data.length);
        if (n > 0) this.push(data.subarray(0, n));
        this.remaining -= n;
        data = data.subarray(n);
        if (this.remaining === 0) this.remaining = -1;
        continue;
      }
      this.head = this.head.length === 0 ? data : Buffer.concat([this.head, data]);
      data = this.readHeaders();
    }
    done();
  }

  /** Reads the headers gathered so far; returns the bytes after a header read (the body's first ones). */
  private readHeaders(): Buffer {
    for (;;) {
      const end = this.head.indexOf(CRLFCRLF);
      const complete = end >= 0 && end <= MAX_HEADER_BYTES;
      if (!complete && this.head.length <= MAX_HEADER_BYTES + CRLFCRLF.length) return Buffer.alloc(0);
      const length = complete ? bodyLength(this.head.toString('latin1', 0, end)) : 'the header is too long';
      if (typeof length === 'number') {
        const rest = this.head.subarray(end + CRLFCRLF.length);
        this.head = Buffer.alloc(0);
        this.push(Buffer.from(`Content-Length: ${length}\r\n\r\n`, 'latin1'));
        this.remaining = length === 0 ? -1 : length;
        return rest;
      }
      this.resync(length);
    }
  }

  /**
   * Drops the bytes of an unreadable header up to the next `Content-Length:`, or when there is none, all but an
   * end that may be the start of one (at least the first byte: the header cannot start there).
   */
  private resync(why: string): void {
    const text = this.head.toString('latin1').toLowerCase();
    let drop = text.indexOf(LENGTH_FIELD, 1);
    if (drop < 0) {
      let keep = Math.min(LENGTH_FIELD.length - 1, text.length - 1);
      while (keep > 0 && !text.endsWith(LENGTH_FIELD.slice(0, keep))) keep--;
      drop = text.length - keep;
    }
    this.skipped(drop, why);
    this.head = this.head.subarray(drop);
  }
}

/** What {@link guardStdio} gives the connection, and where it says what it skipped. */
export interface GuardedStdio {
  readonly input: FrameGuard;
  readonly output: Writable;
  /** Where skipped input is said from now on (until then: standard error). */
  say(log: (message: string) => void): void;
}

/**
 * Guards the process's standard streams (see the file's comment): the frames of `stdin`, and `stdout` kept for
 * the protocol's writer, every other write to it sent to `stderr`.
 */
export function guardStdio(
  stdin: NodeJS.ReadableStream,
  stdout: NodeJS.WritableStream,
  stderr: NodeJS.WritableStream,
): GuardedStdio {
  let log = (message: string): void => void stderr.write(`${message}\n`);
  const input = new FrameGuard((bytes, why) =>
    log(`boltzmark: skipped ${bytes} bytes of input that are not an LSP message (${why})`),
  );
  stdin.pipe(input);
  const write = stdout.write.bind(stdout) as (chunk: Buffer | string, done: (err?: Error | null) => void) => boolean;
  const output = new Writable({
    write(chunk: Buffer, _encoding, done) {
      write(chunk, (err) => done(err ?? null));
    },
  });
  stdout.on('error', (err: Error) => output.destroy(err));
  stdout.on('close', () => output.destroy());
  (stdout as { write: unknown }).write = stderr.write.bind(stderr);
  return {
    input,
    output,
    say(l) {
      log = l;
    },
  };
}
