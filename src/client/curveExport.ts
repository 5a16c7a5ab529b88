/**
 * The curve view's exports: the charts as PNG, the curves and points as CSV,
 * and a Markdown image link to a saved PNG on the clipboard. Files are
 * written only where the user picks in a save dialog (by default beside the
 * note); the note itself is never changed.
 */
import * as vscode from 'vscode';
import type {
  CurvePayload,
  DisplayOptions,
  EnergyAxisUnit,
  RunChartPayload,
  RunQuantity,
  SpectrumTrace,
} from '../core';
import { noteReader } from './loadNoteReader';
import { fileStem, imageLink, pngBytes } from './exportNames';

async function saveAs(
  note: vscode.Uri | null,
  name: string,
  filters: Record<string, string[]>,
): Promise<vscode.Uri | undefined> {
  const defaultUri = note ? vscode.Uri.joinPath(note, '..', name) : undefined;
  return vscode.window.showSaveDialog({ defaultUri, filters, saveLabel: 'Save' });
}

/** Asks where to save the PNG and writes it; returns where, or undefined when cancelled. */
export async function savePng(p: CurvePayload, dataUrl: string): Promise<vscode.Uri | undefined> {
  const uri = await saveAs(vscode.Uri.parse(p.uri), `${fileStem(p.id)}-curve.png`, { 'PNG image': ['png'] });
  if (uri) await vscode.workspace.fs.writeFile(uri, pngBytes(dataUrl));
  return uri;
}

/** Asks where to save the CSV of the shown and pinned runs and writes it. */
export async function saveCsv(
  p: CurvePayload,
  pinned: readonly CurvePayload[],
  unit: EnergyAxisUnit,
): Promise<vscode.Uri | undefined> {
  const uri = await saveAs(vscode.Uri.parse(p.uri), `${fileStem(p.id)}-curve.csv`, { CSV: ['csv'] });
  if (uri)
    await vscode.workspace.fs.writeFile(
      uri,
      new TextEncoder().encode(noteReader().curveCsv([p, ...pinned], unit === 'block' ? p.unit : null)),
    );
  return uri;
}

/** Saves the PNG, then copies `![id](relative/path.png)` to the clipboard. */
export async function copyImageLink(p: CurvePayload, dataUrl: string): Promise<string | undefined> {
  const uri = await savePng(p, dataUrl);
  if (!uri) return undefined;
  const link = imageLink(vscode.Uri.parse(p.uri), uri, p.id);
  await vscode.env.clipboard.writeText(link);
  return link;
}

/** Asks where to save the run comparison's CSV (the quantity shown, with uncertainties) and writes it. */
export async function saveRunsCsv(
  runs: RunChartPayload,
  quantity: RunQuantity,
  note: vscode.Uri | null,
  o: DisplayOptions,
): Promise<vscode.Uri | undefined> {
  const uri = await saveAs(note, `${fileStem(runs.title)}-runs-${quantity}.csv`, { CSV: ['csv'] });
  if (uri) await vscode.workspace.fs.writeFile(uri, Buffer.from(noteReader().runChartCsv(runs, quantity, o), 'utf8'));
  return uri;
}

/** Asks where to save the run comparison's PNG and writes it. */
export async function saveRunsPng(
  runs: RunChartPayload,
  dataUrl: string,
  note: vscode.Uri | null,
): Promise<vscode.Uri | undefined> {
  const uri = await saveAs(note, `${fileStem(runs.title)}-runs.png`, { 'PNG image': ['png'] });
  if (uri) await vscode.workspace.fs.writeFile(uri, pngBytes(dataUrl));
  return uri;
}

/** Asks where to save the spectrum panel's PNG and writes it. */
export async function saveSpectrumPng(
  note: vscode.Uri,
  t: SpectrumTrace,
  dataUrl: string,
): Promise<vscode.Uri | undefined> {
  const uri = await saveAs(note, `${fileStem(t.key)}-spectrum.png`, { 'PNG image': ['png'] });
  if (uri) await vscode.workspace.fs.writeFile(uri, pngBytes(dataUrl));
  return uri;
}

/** Asks where to save the spectrum panel's CSV (the points drawn, the baseline in the region, the integral) and writes it. */
export async function saveSpectrumCsv(note: vscode.Uri, t: SpectrumTrace): Promise<vscode.Uri | undefined> {
  const uri = await saveAs(note, `${fileStem(t.key)}-spectrum.csv`, { CSV: ['csv'] });
  if (uri) await vscode.workspace.fs.writeFile(uri, new TextEncoder().encode(noteReader().spectrumCsv(t)));
  return uri;
}
