// A soak's unstable codes: each with the pass it first differed in and every answer it gave. The
// Bench page lists those found so far, the session page those the saved soak kept.
import type { UnstableCode } from '../../shared/soak';

export function UnstableCodesTable({ codes, label, className = '' }: { codes: readonly UnstableCode[]; label: string; className?: string }) {
  return (
    <table className={`text-left text-sm ${className}`} aria-label={label}>
      <thead>
        <tr className="text-ink-soft">
          <th className="pr-4 font-normal">Code</th>
          <th className="pr-4 font-normal">First differed</th>
          <th className="font-normal">Answers (cos, sin) × times</th>
        </tr>
      </thead>
      <tbody>
        {codes.map((u) => (
          <tr key={u.index}>
            <td className="pr-4 font-mono">{u.code}</td>
            <td className="pr-4">pass {u.firstPass}</td>
            <td className="font-mono">
              {u.answers.map((a) => `(${a.cos}, ${a.sin})×${a.count}`).join('  ')}
              {u.otherAnswers ? ` +${u.otherAnswers} more` : ''}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
