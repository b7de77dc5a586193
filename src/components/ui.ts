// Class names shared by every page: one look for every panel, field and button.
export const panel = 'rounded-lg border border-rule bg-panel p-4';
export const panelTitle = 'mb-3 text-sm font-bold uppercase tracking-wider text-ink-soft';
export const input = 'w-full rounded border border-rule bg-white px-2 py-1.5 text-sm focus:border-signal disabled:bg-paper disabled:text-ink-soft';
export const label = 'grid gap-1 text-sm';
export const btn = 'rounded border border-ink/30 bg-white px-3 py-1.5 text-sm font-bold hover:bg-signal-soft disabled:opacity-50 disabled:hover:bg-white';
export const btnPrimary = 'rounded bg-ink px-4 py-1.5 text-sm font-bold text-paper hover:bg-ink-soft disabled:opacity-50';
export const fieldError = 'text-xs text-fail';
