/**
 * Reading the charts back from the page: each canvas carries its plot area
 * and axis ranges (`data-area`, `data-x`, `data-y`, CSS pixels), so a value
 * maps to a pixel linearly; pixels are read with getImageData at the
 * canvas's device-pixel ratio.
 */
import type { Page } from 'playwright-core';

// Page-side names for the functions passed to the page (this module is typed without the DOM library).
interface PageCanvas {
  readonly width: number;
  readonly clientWidth: number;
  readonly dataset: Record<string, string>;
  getContext(kind: '2d'): { getImageData(x: number, y: number, w: number, h: number): { data: ArrayLike<number> } };
}
declare const document: { getElementById(id: string): PageCanvas };

/** Plot area and axis ranges of one chart. */
export interface ChartGeometry {
  readonly left: number;
  readonly top: number;
  readonly right: number;
  readonly bottom: number;
  readonly x: readonly [number, number];
  readonly y: readonly [number, number];
}

/** An RGBA pixel. */
export type Pixel = readonly [number, number, number, number];

/** The geometry of `#id` as the page last drew it. */
export async function geometry(page: Page, id: string): Promise<ChartGeometry> {
  const d = await page.evaluate((canvasId) => ({ ...document.getElementById(canvasId).dataset }), id);
  const [left, top, right, bottom] = d.area!.split(',').map(Number) as [number, number, number, number];
  const pair = (s: string): [number, number] => s.split(',').map(Number) as [number, number];
  return { left, top, right, bottom, x: pair(d.x!), y: pair(d.y!) };
}

/** CSS-pixel position of a data point. */
export function toPixel(g: ChartGeometry, x: number, y: number): [number, number] {
  return [
    g.left + ((x - g.x[0]) / (g.x[1] - g.x[0])) * (g.right - g.left),
    g.bottom - ((y - g.y[0]) / (g.y[1] - g.y[0])) * (g.bottom - g.top),
  ];
}

/** The pixels within `radius` CSS pixels around each point (a square), per point. */
export async function pixelsAround(
  page: Page,
  id: string,
  points: readonly (readonly [number, number])[],
  radius: number,
): Promise<Pixel[][]> {
  const raw = await page.evaluate(
    ([canvasId, pts, rad]) => {
      const c = document.getElementById(canvasId);
      const ratio = c.width / c.clientWidth;
      const ctx = c.getContext('2d');
      const r = Math.round(rad * ratio);
      return pts.map(([x, y]) =>
        Array.from(ctx.getImageData(Math.round(x * ratio) - r, Math.round(y * ratio) - r, 2 * r + 1, 2 * r + 1).data),
      );
    },
    [id, points, radius] as const,
  );
  return raw.map((d) => {
    const out: Pixel[] = [];
    for (let i = 0; i < d.length; i += 4) out.push([d[i]!, d[i + 1]!, d[i + 2]!, d[i + 3]!]);
    return out;
  });
}

/** True when an opaque pixel is within `tol` of the colour in every channel. */
export function near(p: Pixel, rgb: readonly [number, number, number], tol = 4): boolean {
  return (
    p[3] === 255 && Math.abs(p[0] - rgb[0]) <= tol && Math.abs(p[1] - rgb[1]) <= tol && Math.abs(p[2] - rgb[2]) <= tol
  );
}
