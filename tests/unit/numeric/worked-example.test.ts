import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { createCordicModel, traceCordic } from '../../../shared/numeric';

const doc = readFileSync(fileURLToPath(new URL('../../../docs/model.md', import.meta.url)), 'utf8');

describe('the worked example in docs/model.md', () => {
  it('lists the same iterations the model performs for code 1820', () => {
    const rows = doc
      .split('\n')
      .filter((l) => /^\| \d+ \| [+−]1 \|/.test(l))
      .map((l) => l.split('|').slice(1, -1).map((c) => Number(c.trim().replace('−', '-').replace('+', ''))));
    const t = traceCordic(createCordicModel(), 1820);
    expect(rows).toEqual(t.steps.map((s) => [s.i, s.d, s.sx, s.sy, s.atan, s.x, s.y, s.z]));
    expect(doc).toContain(`cos = (${t.xEnd} + 2) >> 2 = **${t.cos}**`);
    expect(doc).toContain(`sin = (${t.yEnd} + 2) >> 2 = **${t.sin}**`);
  });
});
