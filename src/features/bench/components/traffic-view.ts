// The traffic pane's lines on screen: a scrolling box as tall as every kept line, of which only
// the rows in view exist in the page, built from their text when they come into view. Writing a
// thousand lines costs one height change; scrolling builds one screen of rows.
import type { TrafficLines } from '../live/traffic-lines';

/** Row height in CSS px: the box's line height (leading-4). */
export const ROW_PX = 16;

/** Colours of the terminal codes formatTraffic uses, light on the pane's ink background. */
const COLOUR: Record<string, string> = { '90': '#a3afab', '33': '#e7c067', '36': '#8fd3cb', '32': '#a9d8a2', '31': '#f2a494' };

// eslint-disable-next-line no-control-regex
const CODE = /\x1b\[(\d+)m/;

export class TrafficView {
  /** The kept lines with their colour codes, numbered as `lines` numbers them. */
  private coloured: string[] = [];
  private head = 0;
  private readonly spacer: HTMLDivElement;
  private readonly rows: HTMLDivElement;
  private mark: { line: number; column: number; length: number } | null = null;
  private firstInView = 0;
  private rowsInView = 0;
  private readonly onScroll = () => this.render(false);

  constructor(
    private readonly box: HTMLDivElement,
    private readonly lines: TrafficLines,
  ) {
    this.spacer = document.createElement('div');
    this.rows = document.createElement('div');
    this.rows.style.position = 'absolute';
    this.rows.style.left = '0';
    this.rows.style.right = '0';
    this.rows.style.top = '0';
    this.spacer.style.position = 'relative';
    this.spacer.append(this.rows);
    box.append(this.spacer);
    box.addEventListener('scroll', this.onScroll, { passive: true });
  }

  dispose() {
    this.box.removeEventListener('scroll', this.onScroll);
    this.spacer.remove();
  }

  /** Whether the box shows the newest line (so new lines keep it there). */
  get atEnd() {
    return this.box.scrollTop + this.box.clientHeight >= this.box.scrollHeight - ROW_PX;
  }

  /** Keep lines (with colour codes); the plain text goes to `lines` for find and copy. */
  push(out: string[]) {
    for (const l of out) {
      this.lines.push(l);
      this.coloured.push(l);
    }
    // As many as `lines` keeps; compacted now and then rather than shifted on every line.
    this.head = this.coloured.length - this.lines.length;
    if (this.head >= this.lines.capacity) {
      this.coloured = this.coloured.slice(this.head);
      this.head = 0;
    }
  }

  clear() {
    this.lines.clear();
    this.coloured = [];
    this.head = 0;
    this.mark = null;
    this.render(true);
  }

  /** Bring line `n` to the middle of the box with `length` characters from `column` marked. */
  show(n: number, column: number, length: number) {
    this.mark = { line: n, column, length };
    this.box.scrollTop = Math.max(0, (n - this.lines.first) * ROW_PX - this.box.clientHeight / 2);
    this.render(false);
  }

  /** The plain text of the rows in view. */
  visibleText(): string {
    const from = this.lines.first + this.firstInView;
    return this.lines.text(from, from + this.rowsInView).trimEnd();
  }

  /** Size the box to the kept lines and build the rows in view; `follow` scrolls to the newest. */
  render(follow: boolean) {
    this.spacer.style.height = `${this.lines.length * ROW_PX}px`;
    if (follow) this.box.scrollTop = this.box.scrollHeight;
    const first = Math.max(0, Math.floor(this.box.scrollTop / ROW_PX));
    const count = Math.min(this.lines.length - first, Math.ceil(this.box.clientHeight / ROW_PX) + 1);
    this.firstInView = first;
    this.rowsInView = Math.max(0, count);
    this.rows.style.transform = `translateY(${first * ROW_PX}px)`;
    const built: HTMLDivElement[] = [];
    for (let k = 0; k < count; k++) built.push(this.row(this.lines.first + first + k, this.coloured[this.head + first + k] ?? ''));
    this.rows.replaceChildren(...built);
  }

  /** One row: its text in coloured runs, the marked hit in a <mark>. */
  private row(n: number, text: string): HTMLDivElement {
    const div = document.createElement('div');
    div.style.height = `${ROW_PX}px`;
    div.style.whiteSpace = 'pre';
    const mark = this.mark?.line === n ? this.mark : null;
    const parts = text.split(CODE);
    let colour: string | null = null;
    let at = 0; // position in the plain text
    for (let i = 0; i < parts.length; i++) {
      if (i % 2 === 1) {
        colour = COLOUR[parts[i]] ?? null;
        continue;
      }
      const s = parts[i];
      if (!s) continue;
      // Split the run where the marked hit starts and ends.
      const cuts = mark ? [0, Math.min(s.length, Math.max(0, mark.column - at)), Math.min(s.length, Math.max(0, mark.column + mark.length - at)), s.length] : [0, s.length];
      for (let c = 0; c + 1 < cuts.length; c++) {
        const piece = s.slice(cuts[c], cuts[c + 1]);
        if (!piece) continue;
        const el = document.createElement(mark && c === 1 ? 'mark' : 'span');
        el.textContent = piece;
        if (colour && el.tagName === 'SPAN') el.style.color = colour;
        div.append(el);
      }
      at += s.length;
    }
    return div;
  }
}
