/**
 * The PNG export: both charts stacked on the theme's background under the
 * block's id, drawn on a canvas of their own (text drawn with fillText, so no
 * markup is involved) and returned as a `data:image/png;base64,` URL.
 */
import type { Palette } from './theme';

/** Composes the canvases (in device pixels) under a title line. */
export function composePng(canvases: readonly HTMLCanvasElement[], title: string, p: Palette): string {
  const scale = window.devicePixelRatio || 1;
  const band = Math.round((p.fontSize + 14) * scale);
  const width = Math.max(...canvases.map((c) => c.width));
  const height = band + canvases.reduce((h, c) => h + c.height, 0);
  const out = document.createElement('canvas');
  out.width = width;
  out.height = height;
  const ctx = out.getContext('2d');
  if (!ctx) throw new Error('no 2D context for the export');
  ctx.fillStyle = p.background;
  ctx.fillRect(0, 0, width, height);
  ctx.fillStyle = p.foreground;
  ctx.font = `${Math.round((p.fontSize + 1) * scale)}px ${p.fontFamily}`;
  ctx.textBaseline = 'middle';
  ctx.fillText(title, 10 * scale, band / 2);
  let y = band;
  for (const c of canvases) {
    ctx.drawImage(c, 0, y);
    y += c.height;
  }
  return out.toDataURL('image/png');
}
