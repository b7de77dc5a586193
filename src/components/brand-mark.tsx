/** The Anglebench mark: a unit circle with one rotated vector. */
export function BrandMark({ className }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} aria-hidden="true">
      <circle cx="16" cy="16" r="11" fill="none" stroke="var(--color-signal)" strokeWidth="2.5" />
      <path d="M16 16 L25.5 10.5" stroke="var(--color-reference)" strokeWidth="2.5" strokeLinecap="round" />
      <circle cx="16" cy="16" r="2" fill="currentColor" />
    </svg>
  );
}
