/**
 * API-level tests inside the extension host: the extension as VS Code runs
 * it, asked through VS Code's own provider commands (the same calls the
 * editor makes for hovers, hints, fixes, completions, symbols and lenses).
 * The workspace is a copy of demo/; BOLTZMARK_DEMO_ORIGINAL names the
 * committed folder, to check that nothing was written to the copy.
 */
import { strict as assert } from 'node:assert';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import * as vscode from 'vscode';

const NOTE = 'polarizer-log.md';

/** Resolves when `check` holds, re-checking after each event of `on`; rejects after `ms`. */
function when<T>(on: vscode.Event<unknown>, check: () => T | undefined, ms: number, what: string): Promise<T> {
  return new Promise((resolve, reject) => {
    const now = check();
    if (now !== undefined) return resolve(now);
    const timer = setTimeout(() => (sub.dispose(), reject(new Error(`timed out waiting for ${what}`))), ms);
    const sub = on(() => {
      const v = check();
      if (v === undefined) return;
      clearTimeout(timer);
      sub.dispose();
      resolve(v);
    });
  });
}

function markdownOf(h: vscode.Hover): string {
  return h.contents.map((c) => (typeof c === 'string' ? c : c.value)).join('\n');
}

function labelOf(h: vscode.InlayHint): string {
  return typeof h.label === 'string' ? h.label : h.label.map((p) => p.value).join('');
}

function completionLabel(c: vscode.CompletionItem): string {
  return typeof c.label === 'string' ? c.label : c.label.label;
}

describe('Boltzmark through the VS Code API', () => {
  let doc: vscode.TextDocument;
  let uri: vscode.Uri;
  /** The position of `word` on the first line containing `lineText`. */
  const at = (lineText: string, word: string, offset = 0): vscode.Position => {
    const lines = doc.getText().split('\n');
    const line = lines.findIndex((l) => l.includes(lineText));
    assert.ok(line >= 0, `no line contains ${lineText}`);
    return new vscode.Position(line, lines[line].indexOf(word) + offset);
  };

  before(async () => {
    const folder = vscode.workspace.workspaceFolders?.[0];
    assert.ok(folder, 'the tests run with the demo copy open as the workspace folder');
    uri = vscode.Uri.joinPath(folder.uri, NOTE);
    doc = await vscode.workspace.openTextDocument(uri);
    await vscode.window.showTextDocument(doc);
    const ext = vscode.extensions.getExtension('boltzmark.boltzmark');
    assert.ok(ext, 'the extension is installed');
    await ext.activate();
  });

  it('reports the demo’s deliberate mistakes with their codes at their places', async () => {
    const codes = (): string[] =>
      vscode.languages
        .getDiagnostics(uri)
        .map(
          (d) =>
            `${String(typeof d.code === 'object' ? d.code.value : d.code)}@${d.range.start.line}:${d.range.start.character}`,
        );
    const want = [
      `isotope-unknown@${at('system: C13', 'C13').line}:${at('system: C13', 'C13').character}`,
      `unit-case@${at('field: 7.05 MT', 'MT').line}:${at('field: 7.05 MT', 'MT').character}`,
      `key-unknown@${at('polarisation:', 'polarisation').line}:0`,
    ];
    await when(
      vscode.languages.onDidChangeDiagnostics,
      () => (want.every((w) => codes().includes(w)) ? true : undefined),
      30000,
      `diagnostics ${want.join(', ')}`,
    );
    for (const d of vscode.languages.getDiagnostics(uri)) assert.equal(d.source, 'boltzmark');
  });

  it('hovers a block with T, β, P and its status; an inverted one says so', async () => {
    const hovers = await vscode.commands.executeCommand<vscode.Hover[]>(
      'vscode.executeHoverProvider',
      uri,
      at('id: cell-B run 1', 'cell-B', 1),
    );
    const text = hovers.map(markdownOf).join('\n');
    assert.match(text, /cell\\?-B run 1/); // the id is Markdown-escaped
    assert.match(text, /normal: positive spin temperature/);
    assert.match(text, /5\.61 ± 0\.19 mK/);
    assert.match(text, /178\.2 ± 6\.1/);
    assert.match(text, /31\.2 ± 1\.0 %/);
    const inverted = await vscode.commands.executeCommand<vscode.Hover[]>(
      'vscode.executeHoverProvider',
      uri,
      at('id: Li inversion W-3', 'Li', 1),
    );
    assert.match(inverted.map(markdownOf).join('\n'), /inverted: more population per degeneracy above/);
  });

  it('puts the block’s results in an inlay hint at the end of its first line', async () => {
    const range = new vscode.Range(0, 0, doc.lineCount, 0);
    const hints = await vscode.commands.executeCommand<vscode.InlayHint[]>(
      'vscode.executeInlayHintProvider',
      uri,
      range,
    );
    const fence = at('id: cell-B run 1', 'id').line - 1;
    const onFence = hints.filter((h) => h.position.line === fence).map(labelOf);
    assert.deepEqual(onFence, ['T = 5.61 mK · P = 31.2 % · ε = 241']);
    assert.equal(hints.find((h) => h.position.line === fence)!.position.character, doc.lineAt(fence).text.length);
  });

  it('fixes a wrong-case unit with a quick fix, and undo restores the note', async () => {
    const mt = at('field: 7.05 MT', 'MT');
    // Other providers answer too (the newest VS Code's chat adds "Fix", "Explain", "Modify"), and the workbench may
    // be re-pulling the note's diagnostics when the request comes, which it then answers without ours: asked again
    // until ours is there, for at most 20 s.
    const deadline = Date.now() + 20000;
    let actions: vscode.CodeAction[] = [];
    let fix: vscode.CodeAction | undefined;
    for (let asked = 0; !fix && (asked === 0 || Date.now() < deadline); asked++) {
      if (asked > 0) await new Promise((r) => setTimeout(r, 250));
      actions = await vscode.commands.executeCommand<vscode.CodeAction[]>(
        'vscode.executeCodeActionProvider',
        uri,
        new vscode.Range(mt, mt.translate(0, 2)),
      );
      fix = actions.find((a) => a.title === 'Change unit to mT');
    }
    assert.ok(fix?.edit, `a fix titled "Change unit to mT"; got ${JSON.stringify(actions.map((a) => a.title))}`);
    const before = doc.getText();
    assert.ok(await vscode.workspace.applyEdit(fix.edit));
    assert.equal(doc.lineAt(mt.line).text, 'field: 7.05 mT');
    await vscode.window.showTextDocument(doc);
    await vscode.commands.executeCommand('undo');
    assert.equal(doc.getText(), before);
    assert.equal(doc.isDirty, false);
  });

  it('completes isotopes after "system: " and units after a number', async () => {
    const scratch = await vscode.workspace.openTextDocument({
      language: 'markdown',
      content: '```levels\nsystem: \nfield: 9.4 \n```\n',
    });
    const isotopes = await vscode.commands.executeCommand<vscode.CompletionList>(
      'vscode.executeCompletionItemProvider',
      scratch.uri,
      new vscode.Position(1, 8),
    );
    const names = isotopes.items.map(completionLabel);
    for (const want of ['1H', '13C', '7Li']) assert.ok(names.includes(want), `isotope ${want} offered`);
    const units = await vscode.commands.executeCommand<vscode.CompletionList>(
      'vscode.executeCompletionItemProvider',
      scratch.uri,
      new vscode.Position(2, 11),
    );
    const unitNames = units.items.map(completionLabel);
    for (const want of ['T', 'mT', 'G']) assert.ok(unitNames.includes(want), `unit ${want} offered`);
  });

  it('outlines the blocks by their ids', async () => {
    const symbols = await vscode.commands.executeCommand<vscode.DocumentSymbol[]>(
      'vscode.executeDocumentSymbolProvider',
      uri,
    );
    const names = symbols.map((s) => s.name);
    for (const id of [...doc.getText().matchAll(/^id: (.+)$/gm)].map((m) => m[1]))
      assert.ok(names.includes(id), `symbol ${id}`);
  });

  it('offers the curve view as a code lens, and the command opens it', async () => {
    const lenses = await vscode.commands.executeCommand<vscode.CodeLens[]>('vscode.executeCodeLensProvider', uri);
    const fence = at('id: cell-B run 1', 'id').line - 1;
    const lens = lenses.find((l) => l.range.start.line === fence && l.command?.command === 'boltzmark.showCurve');
    assert.ok(lens?.command, 'a "Show Curve View" lens on the fence line');
    const isView = (t: vscode.Tab): boolean =>
      t.input instanceof vscode.TabInputWebview && t.input.viewType.includes('boltzmark.curveView');
    const opened = when(
      vscode.window.tabGroups.onDidChangeTabs,
      () => (vscode.window.tabGroups.all.some((g) => g.tabs.some(isView)) ? true : undefined),
      30000,
      'the curve view tab',
    );
    await vscode.commands.executeCommand(lens.command.command, ...(lens.command.arguments ?? []));
    await opened;
  });

  it('reads a notebook open in the editor from its cells: a reference finds its run in the cell', async () => {
    const folder = vscode.workspace.workspaceFolders![0]!;
    // Opening the notebook opens each of its cells as a document of its own (`vscode-notebook-cell:`).
    const notebook = await vscode.workspace.openNotebookDocument(
      vscode.Uri.joinPath(folder.uri, 'optical-bench.ipynb'),
    );
    const cell = notebook.getCells().find((c) => c.document.getText().includes('id: Xe cell run 2'));
    assert.ok(cell, 'the demo notebook has the cell of `Xe cell run 2`');
    const scratch = await vscode.workspace.openTextDocument({
      language: 'markdown',
      content:
        '```levels\nid: scratch Xe\nsystem: 129Xe\nfield: 2 T\nsignal:\n  hyperpolarized: 100\n' +
        '  thermal: { run: Xe cell run 2 }\n```\n',
    });
    const ref = new vscode.Position(6, '  thermal: { run: Xe'.length);
    // The server takes the cells and walks the workspace meanwhile: asked until a place comes, for at most 20 s.
    const deadline = Date.now() + 20000;
    let places: (vscode.Location | vscode.LocationLink)[] = [];
    for (let asked = 0; places.length === 0 && (asked === 0 || Date.now() < deadline); asked++) {
      if (asked > 0) await new Promise((r) => setTimeout(r, 250));
      places = await vscode.commands.executeCommand('vscode.executeDefinitionProvider', scratch.uri, ref);
    }
    const targets = places.map((p) => ('targetUri' in p ? p.targetUri : p.uri).toString());
    // One run, in the cell: the notebook's file is not read beside its open cells (it was, as a second copy).
    assert.deepEqual(targets, [cell.document.uri.toString()]);
    const place = places[0]!;
    const range = 'targetRange' in place ? (place.targetSelectionRange ?? place.targetRange) : place.range;
    assert.equal(cell.document.getText(range), 'Xe cell run 2');
  });

  it('has not written to the note on disk', () => {
    const original = process.env.BOLTZMARK_DEMO_ORIGINAL;
    assert.ok(original, 'BOLTZMARK_DEMO_ORIGINAL names the committed demo folder');
    assert.ok(readFileSync(join(original, NOTE)).equals(readFileSync(uri.fsPath)), 'the note on disk is unchanged');
  });
});
