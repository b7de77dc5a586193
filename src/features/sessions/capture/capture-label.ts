// The archive label in words. The Bench page and the runner write JSON labels (see
// src/features/bench/live/connection-recording.ts and cli/run-record.ts); anything else is
// shown as it was written.

const text = (v: unknown): string | null => (typeof v === 'string' && v.trim() ? v : null);

export function captureLabelText(label: string): string {
  let o: unknown;
  try {
    o = JSON.parse(label);
  } catch {
    return `“${label}”`;
  }
  if (!o || typeof o !== 'object' || Array.isArray(o)) return `“${label}”`;
  const l = o as Record<string, unknown>;
  const parts: string[] = [];
  if (l.recordedBy === 'anglebench bench') {
    parts.push('recorded on the Bench page');
    if (text(l.transport)) parts.push(`over ${String(l.transport)}`);
    if (typeof l.baud === 'number') parts.push(`at ${l.baud.toLocaleString('en-US')} baud`);
    const opened = text(l.openedAt) && new Date(String(l.openedAt));
    if (opened && !Number.isNaN(opened.getTime())) parts.push(`connected ${opened.toISOString().slice(0, 16).replace('T', ' ')} UTC`);
  } else if (l.recordedBy === 'anglebench run') {
    parts.push('recorded by the runner');
    if (text(l.core)) parts.push(`for core ${String(l.core)}`);
    if (text(l.build)) parts.push(`build ${String(l.build)}`);
    if (text(l.board)) parts.push(`on board ${String(l.board)}`);
    const plan = l.plan as { kind?: unknown } | undefined;
    if (plan && typeof plan.kind === 'string') parts.push(`plan ${plan.kind}`);
  } else {
    return `“${label}”`;
  }
  return parts.join(', ');
}
