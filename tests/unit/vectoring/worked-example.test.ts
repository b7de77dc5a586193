import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { createVectorModel } from '../../../shared/vectoring';

const doc = readFileSync(fileURLToPath(new URL('../../../docs/model.md', import.meta.url)), 'utf8');
const section = doc.slice(doc.indexOf('## Vectoring cores'));

describe('the vectoring worked example in docs/model.md', () => {
  it('ends where the model ends for (−9000, 5000), and each row follows from the one before', () => {
    const rows = section
      .split('\n')
      .filter((l) => /^\| \d+ \| [<≥] 0 \|/.test(l))
      .map((l) => l.split('|').slice(2, -1).map((c) => c.trim()));
    expect(rows).toHaveLength(16);
    const num = (s: string) => Number(s.replace('−', '-').replace('+', ''));
    // The state after the half-turn pre-rotation, as the example states it.
    let [x, y, z] = [36000, -20000, 131072];
    rows.forEach(([ySign, d, sx, sy, atan, xAfter, yAfter, zAfter], i) => {
      expect(ySign).toBe(y < 0 ? '< 0' : '≥ 0');
      const dir = y < 0 ? 1 : -1;
      expect(num(d)).toBe(dir);
      expect([num(sx), num(sy)]).toEqual([Math.floor(x / 2 ** i), Math.floor(y / 2 ** i)]);
      [x, y, z] = [x - dir * num(sy), y + dir * num(sx), z - dir * num(atan)];
      expect([num(xAfter), num(yAfter), num(zAfter)]).toEqual([x, y, z]);
    });
    const answer = createVectorModel().answer(-9000, 5000);
    expect(section).toContain(`Angle: (${z} + 2) >> 2 = **${answer.angle}**`);
    expect(section).toContain(`Magnitude: (${x} + 2) >> 2 = **${answer.magnitude}**`);
  });
});
