// The traffic pane's text as plain lines, bounded like the terminal's scroll-back, for finding
// and copying: the terminal shows colours, this keeps the words. Lines are numbered from the
// first ever written, so a hit can be mapped onto the terminal's buffer.

// eslint-disable-next-line no-control-regex
const ANSI = /\x1b\[[0-9;]*m/g;

export const stripAnsi = (s: string) => s.replace(ANSI, '');

export class TrafficLines {
  private lines: string[] = [];
  private head = 0;
  /** Lines ever written (the number of the next one). */
  written = 0;

  constructor(readonly capacity: number) {}

  /** Lines still kept. */
  get length() {
    return this.lines.length - this.head;
  }

  /** Number of the oldest line still kept. */
  get first() {
    return this.written - this.length;
  }

  push(line: string) {
    this.lines.push(stripAnsi(line));
    this.written++;
    if (this.length > this.capacity) this.head++;
    // Compact now and then rather than shifting on every line.
    if (this.head >= this.capacity) {
      this.lines = this.lines.slice(this.head);
      this.head = 0;
    }
  }

  clear() {
    this.lines = [];
    this.head = 0;
    this.written = 0;
  }

  /** Line number `n`, or undefined once it has left the bound. */
  at(n: number): string | undefined {
    const i = n - this.first;
    return i >= 0 && i < this.length ? this.lines[this.head + i] : undefined;
  }

  /** Lines `from` ..< `to` joined with newlines (clamped to what is kept). */
  text(from = this.first, to = this.written): string {
    const a = Math.max(from, this.first) - this.first + this.head;
    const b = Math.min(to, this.written) - this.first + this.head;
    return this.lines.slice(a, Math.max(a, b)).join('\n');
  }

  /**
   * The next line holding `query` (case-insensitive) after line `from` (or before it, going back),
   * wrapping around the kept lines; null when no kept line holds it.
   */
  find(query: string, from: number, direction: 1 | -1): { line: number; column: number } | null {
    const q = query.toLowerCase();
    const n = this.length;
    if (!q || n === 0) return null;
    // Start just past `from`, inside the kept range.
    let i = Math.min(Math.max(from - this.first, -1), n) + direction;
    for (let step = 0; step < n; step++) {
      i = ((i % n) + n) % n;
      const column = this.lines[this.head + i].toLowerCase().indexOf(q);
      if (column >= 0) return { line: this.first + i, column };
      i += direction;
    }
    return null;
  }

  /** How many kept lines hold `query`, and the position of `line` among them (1-based). */
  count(query: string, line: number): { total: number; index: number } {
    const q = query.toLowerCase();
    let total = 0;
    let index = 0;
    for (let i = 0; i < this.length; i++) {
      if (!this.lines[this.head + i].toLowerCase().includes(q)) continue;
      total++;
      if (this.first + i === line) index = total;
    }
    return { total, index };
  }
}
