// A verdict always in words as well as colour.
export function VerdictBadge({ passed, className = '' }: { passed: boolean; className?: string }) {
  return (
    <span data-testid="verdict" className={`inline-block rounded px-1.5 py-0.5 text-xs font-bold uppercase tracking-wide ${passed ? 'bg-pass-soft text-pass' : 'bg-fail-soft text-fail'} ${className}`}>
      {passed ? 'Pass' : 'Fail'}
    </span>
  );
}

export function RegressionBadge() {
  return (
    <span title="Fails a limit its core's baseline met" className="inline-block rounded border border-fail px-1.5 py-0.5 text-xs font-bold text-fail">
      Regression
    </span>
  );
}
