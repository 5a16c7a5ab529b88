/**
 * A client of the bundled server (`node dist/server.js --stdio`) that frames
 * JSON-RPC itself, with no protocol library: it can send what a library-made
 * client never would (bytes that are no frame, the same version twice, a
 * position past a line's end), and it checks what comes back at the byte
 * level: every byte of the server's standard output must belong to a frame
 * whose only header is `Content-Length` (and, optionally, `Content-Type`)
 * and whose body is one JSON-RPC 2.0 message.
 */
import { strict as assert } from 'node:assert';
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';

/** One message from the server. */
export interface RawMessage {
  readonly jsonrpc?: string;
  readonly id?: number | string | null;
  readonly method?: string;
  readonly params?: unknown;
  readonly result?: unknown;
  readonly error?: { readonly code: number; readonly message: string };
}

export interface RawClient {
  readonly proc: ChildProcess;
  /** Every message from the server, in order. */
  readonly seen: RawMessage[];
  /** What on the server's standard output was not a well-formed frame (should stay empty). */
  readonly notFrames: string[];
  /**
   * Sends a request and resolves with its response (fails at once if the server exits first); `before`, bytes
   * written in the same write just ahead of the request's frame.
   */
  request(method: string, params?: unknown, before?: Buffer): Promise<RawMessage>;
  notify(method: string, params?: unknown): void;
  /** Writes bytes as they are, framed or not. */
  writeRaw(bytes: Buffer | string): void;
  /** Initializes with these client capabilities and sends `initialized`. */
  initialize(capabilities?: unknown): Promise<RawMessage>;
  /** The messages the server logged (`window/logMessage`). */
  logs(): string[];
  /** The exit code, once the server exits. */
  readonly exited: Promise<number | null>;
  /** Ends the server: shutdown and exit when it is still alive, kill otherwise. */
  close(): Promise<void>;
}

/** Frames one message as the base protocol does. */
export function frame(message: unknown): Buffer {
  const body = Buffer.from(JSON.stringify(message), 'utf8');
  return Buffer.concat([Buffer.from(`Content-Length: ${body.length}\r\n\r\n`, 'ascii'), body]);
}

/** Starts the server on stdio; server-to-client requests are answered as a client without them would. */
export function rawClient(): RawClient {
  if (!existsSync('dist/server.js'))
    throw new Error('dist/server.js is missing: run `npm run build` first (npm test does)');
  const proc = spawn(process.execPath, ['dist/server.js', '--stdio'], { stdio: ['pipe', 'pipe', 'pipe'] });
  proc.stderr!.resume();
  const seen: RawMessage[] = [];
  const notFrames: string[] = [];
  const waiting = new Map<number, (m: RawMessage) => void>();
  let buffer = Buffer.alloc(0);
  const writeRaw = (bytes: Buffer | string): void => void proc.stdin!.write(bytes);
  proc.stdout!.on('data', (chunk: Buffer) => {
    buffer = Buffer.concat([buffer, chunk]);
    for (;;) {
      const head = buffer.indexOf('\r\n\r\n');
      if (head < 0) return;
      const fields = buffer.subarray(0, head).toString('latin1').split('\r\n');
      const length = /^Content-Length: (\d+)$/.exec(fields[0] ?? '')?.[1];
      const others = fields.slice(1).filter((f) => !/^Content-Type: [^\r\n]+$/.test(f));
      if (length === undefined || others.length > 0) {
        // Not a frame: record it and drop everything (the stream cannot be read further).
        notFrames.push(buffer.toString('utf8', 0, Math.min(buffer.length, 400)));
        buffer = Buffer.alloc(0);
        return;
      }
      const end = head + 4 + Number(length);
      if (buffer.length < end) return;
      const body = buffer.toString('utf8', head + 4, end);
      buffer = buffer.subarray(end);
      let message: RawMessage;
      try {
        message = JSON.parse(body) as RawMessage;
      } catch {
        notFrames.push(`a body that is not JSON: ${body.slice(0, 400)}`);
        continue;
      }
      if (message.jsonrpc !== '2.0') notFrames.push(`a message without jsonrpc 2.0: ${body.slice(0, 400)}`);
      seen.push(message);
      if (message.method !== undefined && message.id !== undefined)
        writeRaw(frame({ jsonrpc: '2.0', id: message.id, error: { code: -32601, message: 'not here' } }));
      else if (typeof message.id === 'number') waiting.get(message.id)?.(message);
    }
  });
  const exited = new Promise<number | null>((resolve) => proc.once('exit', (code) => resolve(code)));
  let next = 0;
  const request = (method: string, params?: unknown, before?: Buffer): Promise<RawMessage> => {
    const id = ++next;
    const reply = new Promise<RawMessage>((resolve) => waiting.set(id, resolve));
    const message = frame({ jsonrpc: '2.0', id, method, ...(params === undefined ? {} : { params }) });
    writeRaw(before ? Buffer.concat([before, message]) : message);
    return Promise.race([
      reply,
      exited.then((code) => assert.fail(`the server exited (${code}) before answering ${method}`)),
    ]);
  };
  const notify = (method: string, params?: unknown): void =>
    writeRaw(frame({ jsonrpc: '2.0', method, ...(params === undefined ? {} : { params }) }));
  return {
    proc,
    seen,
    notFrames,
    request,
    notify,
    writeRaw,
    async initialize(capabilities = {}) {
      const r = await request('initialize', { processId: null, rootUri: null, capabilities });
      notify('initialized', {});
      return r;
    },
    logs: () =>
      seen.filter((m) => m.method === 'window/logMessage').map((m) => (m.params as { message: string }).message),
    exited,
    async close() {
      if (proc.exitCode === null && proc.signalCode === null) {
        await request('shutdown');
        notify('exit');
      }
      await exited;
    },
  };
}
