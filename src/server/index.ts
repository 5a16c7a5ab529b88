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
import { logStrayRejections } from './strayRejections';
import { diskSpectrumAccess, listSpectrumFiles, workerParser } from './spectraNode';
import { watchInput } from './transportInput';

const guard = protocolGuard();
const connection = createConnection(ProposedFeatures.all, { messageStrategy: guard.messageStrategy });
logStrayRejections(connection);
startServer(connection, {
  guard,
  notes: diskNotes,
  spectra: { access: diskSpectrumAccess, parse: workerParser(), list: listSpectrumFiles },
  // Bytes from the client as they arrive, heard before the protocol reader, which starts listening after this.
  onInput: (heard) => void watchInput(process.argv, { stdin: process.stdin, parent: process }, heard),
});
