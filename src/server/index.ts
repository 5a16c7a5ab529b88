#!/usr/bin/env node
/**
 * Entry point of the language server: `boltzmark-lsp --stdio` for any
 * editor, or started by the VS Code client over IPC. The transport comes
 * from the command line (`--stdio`, `--node-ipc`, `--socket=<port>`).
 */
import { createConnection, ProposedFeatures } from 'vscode-languageserver/node';
import { protocolGuard } from './protocolGuard';
import { diskNotes } from './runs/diskNotes';
import { startServer } from './server';
import { guardStdio } from './stdioFrames';
import { logStrayRejections } from './strayRejections';
import { diskSpectrumAccess, listSpectrumFiles, workerParser } from './spectraNode';
import { watchInput } from './transportInput';

const guard = protocolGuard();
// Over stdio the streams are guarded below JSON-RPC (stdioFrames.ts); the other transports are the library's.
const stdio = process.argv.includes('--stdio') ? guardStdio(process.stdin, process.stdout, process.stderr) : null;
const connection = stdio
  ? createConnection(ProposedFeatures.all, stdio.input, stdio.output, { messageStrategy: guard.messageStrategy })
  : createConnection(ProposedFeatures.all, { messageStrategy: guard.messageStrategy });
stdio?.say((message) => connection.console.warn(message));
logStrayRejections(connection);
startServer(connection, {
  guard,
  notes: diskNotes,
  spectra: { access: diskSpectrumAccess, parse: workerParser(), list: listSpectrumFiles },
  // Bytes from the client as they arrive, heard before the protocol reader, which starts listening after this.
  onInput: (heard) => void watchInput(process.argv, { stdin: process.stdin, parent: process }, heard),
});
