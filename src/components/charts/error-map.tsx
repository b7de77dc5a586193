// The x–y error map of a vectoring core: the input square in MAP_CELLS × MAP_CELLS cells, each
// coloured by the largest |error| of the answers that fell in it, on a canvas (a heat map is a
// few thousand rectangles, which a scatter chart would draw point by point). Which error it shows
// is the reader's choice; the colour bar says what the darkest cell means.
import { useEffect, useRef, useState } from 'react';
import { panel, panelTitle } from '../ui';
import { FAIL, INK, REFERENCE, RULE, SIGNAL } from './uplot-theme';
import { MAP_CELLS, type ErrorMapData } from './vector-plot-data';

/** Where the map gets its data: polled once per animation frame (`all`: the first poll). */
export interface ErrorMapFeed {
  poll(all: boolean): ErrorMapData | null;
}

type Which = 'angle' | 'magnitude';

const PLOT_PX = 256;
const LEFT = 52;
const BOTTOM = 36;
const TOP = 8;
const BAR_W = 12;
const RIGHT = 70;
const FONT = '11px "JetBrains Mono", monospace';
const LABEL_FONT = '12px "Atkinson Hyperlegible", sans-serif';
const EMPTY = '#f6f3ec';

const hex = (c: string) => [1, 3, 5].map((i) => parseInt(c.slice(i, i + 2), 16));
const STOPS = [hex('#d3ece8'), hex(REFERENCE), hex(SIGNAL), hex(FAIL)];

/** A share 0..1 of the largest error as a colour: pale teal through teal and amber to red. */
export function mapColour(share: number): string {
  const t = Math.min(1, Math.max(0, share)) * (STOPS.length - 1);
  const i = Math.min(STOPS.length - 2, Math.floor(t));
  const f = t - i;
  const [r, g, b] = STOPS[i].map((v, k) => Math.round(v + (STOPS[i + 1][k] - v) * f));
  return `rgb(${r}, ${g}, ${b})`;
}

/** The largest value of a map, and the cell it is in (null when no cell is filled). */
export function mapPeak(values: Float32Array, cells: number): { value: number; cx: number; cy: number } | null {
  let best = -1;
  let at = -1;
  for (let i = 0; i < values.length; i++) {
    if (values[i] > best) {
      best = values[i];
      at = i;
    }
  }
  return at < 0 || best < 0 ? null : { value: best, cx: at % cells, cy: Math.floor(at / cells) };
}

const fmt = (v: number) => (Math.abs(v) >= 100 ? v.toFixed(0) : Math.abs(v) >= 10 ? v.toFixed(1) : v.toFixed(2));

function draw(canvas: HTMLCanvasElement, d: ErrorMapData, which: Which) {
  const ratio = window.devicePixelRatio || 1;
  const w = LEFT + PLOT_PX + RIGHT;
  const h = TOP + PLOT_PX + BOTTOM;
  if (canvas.width !== w * ratio) {
    canvas.width = w * ratio;
    canvas.height = h * ratio;
  }
  const g = canvas.getContext('2d');
  if (!g) return;
  g.setTransform(ratio, 0, 0, ratio, 0, 0);
  g.clearRect(0, 0, w, h);
  const values = which === 'angle' ? d.angle : d.magnitude;
  const peak = mapPeak(values, d.cells)?.value ?? 0;
  const cell = PLOT_PX / d.cells;
  g.fillStyle = EMPTY;
  g.fillRect(LEFT, TOP, PLOT_PX, PLOT_PX);
  for (let cy = 0; cy < d.cells; cy++) {
    for (let cx = 0; cx < d.cells; cx++) {
      const v = values[cy * d.cells + cx];
      if (v < 0) continue;
      g.fillStyle = mapColour(peak > 0 ? v / peak : 0);
      // Row 0 is the lowest y: drawn at the bottom. Cells overlap by a pixel fraction so no seams show.
      g.fillRect(LEFT + cx * cell, TOP + PLOT_PX - (cy + 1) * cell, cell + 0.5, cell + 0.5);
    }
  }
  // Axes through the origin, and the frame.
  g.strokeStyle = RULE;
  g.lineWidth = 1;
  const zero = ((0 - d.min) / (d.max - d.min + 1)) * PLOT_PX;
  g.beginPath();
  g.moveTo(LEFT + zero, TOP);
  g.lineTo(LEFT + zero, TOP + PLOT_PX);
  g.moveTo(LEFT, TOP + PLOT_PX - zero);
  g.lineTo(LEFT + PLOT_PX, TOP + PLOT_PX - zero);
  g.stroke();
  g.strokeStyle = INK;
  g.strokeRect(LEFT + 0.5, TOP + 0.5, PLOT_PX - 1, PLOT_PX - 1);
  g.fillStyle = INK;
  g.font = FONT;
  const lo = d.min / d.scale;
  const hi = (d.max + 1) / d.scale;
  g.textAlign = 'center';
  g.textBaseline = 'top';
  for (const [v, px] of [
    [lo, 0],
    [0, zero],
    [hi, PLOT_PX],
  ] as const) {
    g.fillText(fmt(v), LEFT + px, TOP + PLOT_PX + 4);
  }
  g.textAlign = 'right';
  g.textBaseline = 'middle';
  for (const [v, px] of [
    [lo, 0],
    [0, zero],
    [hi, PLOT_PX],
  ] as const) {
    g.fillText(fmt(v), LEFT - 4, TOP + PLOT_PX - px);
  }
  g.font = LABEL_FONT;
  g.textAlign = 'center';
  g.textBaseline = 'bottom';
  g.fillText('x', LEFT + PLOT_PX / 2, h - 2);
  // Upright, above the y tick labels' column: a single letter reads best unturned.
  g.textAlign = 'left';
  g.textBaseline = 'middle';
  g.fillText('y', 4, TOP + PLOT_PX / 4);
  // The colour bar: 0 at the bottom, the largest |error| at the top.
  const bx = LEFT + PLOT_PX + 14;
  for (let i = 0; i < PLOT_PX; i++) {
    g.fillStyle = mapColour(1 - i / PLOT_PX);
    g.fillRect(bx, TOP + i, BAR_W, 1.5);
  }
  g.strokeStyle = INK;
  g.strokeRect(bx + 0.5, TOP + 0.5, BAR_W - 1, PLOT_PX - 1);
  g.fillStyle = INK;
  g.font = FONT;
  g.textAlign = 'left';
  g.textBaseline = 'top';
  g.fillText(fmt(peak), bx + BAR_W + 4, TOP);
  g.textBaseline = 'bottom';
  g.fillText('0', bx + BAR_W + 4, TOP + PLOT_PX);
  g.textBaseline = 'middle';
  g.fillText('LSB', bx + BAR_W + 4, TOP + PLOT_PX / 2);
}

/** Words for the map, for those who cannot see it: where the largest error is. */
export function mapWords(d: ErrorMapData | null, which: Which): string {
  const name = which === 'angle' ? 'angle' : 'magnitude';
  if (!d) return `Map of the largest |${name} error| over the x–y input plane: no answers yet.`;
  const values = which === 'angle' ? d.angle : d.magnitude;
  const peak = mapPeak(values, d.cells);
  let filled = 0;
  for (const v of values) filled += v >= 0 ? 1 : 0;
  if (!peak) return `Map of the largest |${name} error| over the x–y input plane: no answers yet.`;
  const centre = (c: number) => fmt((d.min + ((c + 0.5) / d.cells) * (d.max - d.min + 1)) / d.scale);
  return `Map of the largest |${name} error| over the x–y input plane, ${filled} of ${d.cells * d.cells} cells answered; the largest, ${fmt(peak.value)} LSB, near x = ${centre(peak.cx)}, y = ${centre(peak.cy)}.`;
}

export function ErrorMap({ feed, testId = 'chart-error-map' }: { feed: ErrorMapFeed; testId?: string }) {
  const canvas = useRef<HTMLCanvasElement | null>(null);
  const [which, setWhich] = useState<Which>('angle');
  const [words, setWords] = useState(() => mapWords(null, 'angle'));

  useEffect(() => {
    let raf = 0;
    let first = true;
    let last: ErrorMapData | null = null;
    let lastWordsAt = -Infinity;
    let drawn = false;
    let wordsStale = false;
    const tick = (t: number) => {
      const fresh = feed.poll(first);
      first = false;
      if (fresh) last = fresh;
      if ((fresh || !drawn) && last && canvas.current) {
        draw(canvas.current, last, which);
        drawn = true;
        wordsStale = true;
      }
      // The description is React state: kept to a few updates a second, the last one always made.
      if (wordsStale && last && t - lastWordsAt > 500) {
        lastWordsAt = t;
        wordsStale = false;
        setWords(mapWords(last, which));
      }
      raf = requestAnimationFrame(tick);
    };
    raf = requestAnimationFrame(tick);
    return () => cancelAnimationFrame(raf);
  }, [feed, which]);

  return (
    <section aria-label="Error map over the x–y plane" className={`${panel} min-w-0 break-inside-avoid`}>
      <div className="mb-2 flex flex-wrap items-baseline justify-between gap-2">
        <h3 className={panelTitle}>Error map over the x–y plane</h3>
        <label className="text-sm text-ink-soft">
          Shows{' '}
          <select className="rounded border border-rule bg-panel px-1 py-0.5 text-ink" value={which} onChange={(e) => setWhich(e.target.value as Which)}>
            <option value="angle">largest |angle error|</option>
            <option value="magnitude">largest |magnitude error|</option>
          </select>
        </label>
      </div>
      <div className="flex justify-center" data-testid={testId}>
        <canvas ref={canvas} role="img" aria-label={words} style={{ width: LEFT + PLOT_PX + RIGHT, height: TOP + PLOT_PX + BOTTOM }} />
      </div>
      <p className="mt-1 text-xs text-ink-soft">
        Each of the {MAP_CELLS} × {MAP_CELLS} cells of the input square takes the colour of the largest |error| among its answers; cells without answers stay blank.
      </p>
    </section>
  );
}
