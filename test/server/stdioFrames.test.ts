import { strict as assert } from 'node:assert';
import { PassThrough } from 'node:stream';
import { FrameGuard, guardStdio, MAX_HEADER_BYTES } from '../../src/server/stdioFrames';

// The byte-level guard of the stdio transport: whole LSP frames pass (however the pipe cuts them), whatever is no
// frame is skipped up to the next `Content-Length:`, and the real standard output is the protocol writer's alone.

const frame = (body: string): Buffer => {
  const b = Buffer.from(body, 'utf8');
  return Buffer.concat([Buffer.from(`Content-Length: ${b.length}\r\n\r\n`, 'latin1'), b]);
};

/** What a guard passes on for `input` fed in chunks of `size` bytes, and what it said it skipped. */
async function through(input: Buffer, size: number): Promise<{ out: string; skipped: [number, string][] }> {
  const skipped: [number, string][] = [];
  const guard = new FrameGuard((bytes, why) => skipped.push([bytes, why]));
  const parts: Buffer[] = [];
  guard.on('data', (b: Buffer) => parts.push(b));
  const ended = new Promise((resolve) => guard.on('end', resolve));
  for (let i = 0; i < input.length; i += size) guard.write(input.subarray(i, i + size));
  guard.end();
  await ended;
  return { out: Buffer.concat(parts).toString('utf8'), skipped };
}

describe('stdioFrames: the stdio transport guarded below JSON-RPC', () => {
  const a = frame('{"jsonrpc":"2.0","id":1,"method":"shutdown","params":{"text":"Content-Length: 5 — ½ 😀"}}');
  const b = frame('{"jsonrpc":"2.0","method":"exit"}');

  it('passes whole frames unchanged, however the input is cut (down to single bytes)', async () => {
    const input = Buffer.concat([a, b, frame('')]);
    for (const size of [1, 2, 3, 7, 64, input.length]) {
      const r = await through(input, size);
      assert.equal(r.out, input.toString('utf8'), `chunks of ${size}`);
      assert.deepEqual(r.skipped, []);
    }
  });

  it('normalizes a header with Content-Type, any field case and spaces to the length alone', async () => {
    const body = '{"jsonrpc":"2.0","method":"exit"}';
    const header = `content-length:   ${body.length}  \r\nContent-Type: application/vscode-jsonrpc; charset=utf-8\r\n\r\n`;
    assert.equal((await through(Buffer.from(header + body), 5)).out, b.toString('utf8'));
  });

  it('skips what is no frame up to the next Content-Length, and says how much and why', async () => {
    const cases: [string, RegExp][] = [
      ['Content-Length: abc\r\n\r\n{}', /not a whole number/],
      ['Content-Length: -5\r\n\r\n{}', /not a whole number/],
      ['Content-Length: 2\n\n{}', /Name: value/],
      ['no colon here\r\n\r\n', /Name: value/],
      ['Content-Type: application/json\r\n\r\n{}', /no Content-Length/],
      ['Content-Length: 99999999999999\r\n\r\n', /more than a message can be/],
      [`X-Padding: ${'x'.repeat(MAX_HEADER_BYTES)}\r\n`, /too long/],
      ['\u0000\u00ff garbage without any header end', /Name: value|too long/],
    ];
    for (const [garbage, why] of cases)
      for (const size of [1, 5, 4096]) {
        const input = Buffer.concat([a, Buffer.from(garbage, 'latin1'), b]);
        const r = await through(input, size);
        assert.equal(r.out, Buffer.concat([a, b]).toString('utf8'), `${JSON.stringify(garbage)} in chunks of ${size}`);
        assert.ok(r.skipped.length > 0, JSON.stringify(garbage));
        assert.match(r.skipped[0]![1], why, JSON.stringify(garbage));
        assert.equal(
          r.skipped.reduce((n, [bytes]) => n + bytes, 0),
          Buffer.byteLength(garbage, 'latin1'),
          `every byte of ${JSON.stringify(garbage.slice(0, 30))} and no other is skipped (chunks of ${size})`,
        );
      }
  });

  it('refuses a header that gives its length twice', async () => {
    const r = await through(Buffer.from('Content-Length: 1\r\nContent-Length: 1\r\n\r\n{'), 4);
    assert.match(r.skipped[0]![1], /twice/);
  });

  it('keeps the real standard output for the protocol writer and sends every other write to stderr', async () => {
    const stdin = new PassThrough();
    const stdout = new PassThrough();
    const stderr = new PassThrough();
    const written = { out: '', err: '' };
    stdout.on('data', (c: Buffer) => (written.out += c.toString()));
    stderr.on('data', (c: Buffer) => (written.err += c.toString()));
    const io = guardStdio(stdin, stdout, stderr);
    stdout.write('a stray line\n');
    await new Promise<void>((resolve, reject) => io.output.write(b, (err) => (err ? reject(err) : resolve())));
    assert.equal(written.out, b.toString());
    assert.equal(written.err, 'a stray line\n');
    // The input side: frames through, garbage said on stderr until the connection's log takes over.
    const passed: Buffer[] = [];
    io.input.on('data', (c: Buffer) => passed.push(c));
    stdin.write(Buffer.concat([Buffer.from('junk\r\n\r\n'), a]));
    await new Promise(setImmediate);
    assert.equal(Buffer.concat(passed).toString(), a.toString());
    assert.match(written.err, /skipped 8 bytes of input that are not an LSP message/);
    const said: string[] = [];
    io.say((m) => said.push(m));
    stdin.write('x\r\n\r\n');
    await new Promise(setImmediate);
    assert.equal(said.length, 1);
  });
});
