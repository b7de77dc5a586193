import { Fragment } from 'react';
import type { ToneResult } from '../live/score-protocol';

const db = (v: number) => (Number.isFinite(v) ? `${v.toFixed(1)} dB` : v > 0 ? '∞ dB' : '—');
const bits = (v: number) => (Number.isFinite(v) ? `${v.toFixed(2)} bits` : '—');

/** What each figure means, in one line (IEEE Std 1241 terms). */
const ROWS = [
  { key: 'sfdr', name: 'SFDR', show: (f: { sfdrDbc: number }) => db(f.sfdrDbc), says: 'How far the largest spur sits below the tone.' },
  { key: 'sinad', name: 'SINAD', show: (f: { sinadDb: number }) => db(f.sinadDb), says: 'The tone over all noise and distortion together.' },
  { key: 'enob', name: 'ENOB', show: (f: { enob: number }) => bits(f.enob), says: 'SINAD as the bits of an ideal quantiser: (SINAD − 1.76) / 6.02.' },
] as const;

/** Spectral figures of a coherent tone plan, per channel. */
export function ToneFigures({ tone }: { tone: ToneResult }) {
  return (
    <div className="border-t border-rule pt-3" data-testid="tone-figures">
      <h3 className="mb-1 text-sm font-bold">Spectrum of the tone</h3>
      {'unavailable' in tone ? (
        <p className="text-sm text-ink-soft">Spectral figures {tone.unavailable}.</p>
      ) : (
        <table className="w-full text-left text-sm">
          <thead>
            <tr className="text-ink-soft">
              <th className="font-normal" scope="col">
                Figure
              </th>
              <th className="font-normal" scope="col">
                cos
              </th>
              <th className="font-normal" scope="col">
                sin
              </th>
            </tr>
          </thead>
          <tbody>
            {ROWS.map((r) => (
              <Fragment key={r.key}>
                <tr>
                  <th scope="row" className="pr-2 font-normal">
                    {r.name}
                  </th>
                  <td className="pr-2 font-mono whitespace-nowrap" data-testid={`tone-${r.key}-cos`}>
                    {r.show(tone.cos)}
                  </td>
                  <td className="font-mono whitespace-nowrap" data-testid={`tone-${r.key}-sin`}>
                    {r.show(tone.sin)}
                  </td>
                </tr>
                <tr>
                  <td colSpan={3} className="pb-1 text-xs text-ink-soft">
                    {r.says}
                  </td>
                </tr>
              </Fragment>
            ))}
          </tbody>
        </table>
      )}
    </div>
  );
}
