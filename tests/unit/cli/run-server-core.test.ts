import { describe, expect, it } from 'vitest';
import { fetchCore, ServerError } from '../../../cli/run-server';

// The runner reads the core from GET /api/cores: a rotation core's model, a vectoring core's configuration.
const serving = (cores: unknown[]) => (async () => new Response(JSON.stringify({ cores }), { status: 200, headers: { 'content-type': 'application/json' } })) as unknown as typeof fetch;
const server = { url: 'http://lab.test', token: 'ab_x' };

describe('fetchCore', () => {
  it('reads a vectoring core with its configuration (defaults filled) and its vectoring limits', async () => {
    const core = { id: 3, slug: 'phase-det', name: 'Phase detector', mode: 'vectoring', modelConfig: null, vectorConfig: { inBits: 10 }, limits: { maxAngleErrorLsb: 12 }, linkProfile: { baud: 3_000_000 } };
    const got = await fetchCore(serving([core]), server, 'phase-det');
    expect(got).toMatchObject({ id: 3, mode: 'vectoring', baud: 3_000_000, limits: { maxAngleErrorLsb: 12 } });
    if (got.mode !== 'vectoring') throw new Error('not read as a vectoring core');
    // docs/model.md "Vectoring cores": inFrac defaults to inBits − 2, magBits to inBits + 2.
    expect(got.vectorConfig).toMatchObject({ inBits: 10, inFrac: 8, magBits: 12 });
  });

  it('refuses a core of a mode it does not know, and a vectoring configuration it cannot use, by name', async () => {
    const odd = { id: 5, slug: 'odd', name: 'Odd', mode: 'hyperbolic', modelConfig: null, limits: {}, linkProfile: {} };
    await expect(fetchCore(serving([odd]), server, 'odd')).rejects.toThrow(ServerError);
    await expect(fetchCore(serving([odd]), server, 'odd')).rejects.toThrow('core "odd" is a hyperbolic core: this runner runs rotation and vectoring cores only');
    const bad = { id: 6, slug: 'bad', name: 'Bad', mode: 'vectoring', modelConfig: null, vectorConfig: { inBits: 8, inFrac: 8 }, limits: {}, linkProfile: {} };
    await expect(fetchCore(serving([bad]), server, 'bad')).rejects.toThrow(/^core "bad" on the server has a vectoring configuration this runner cannot use: .*inFrac/);
  });

  it('still reads a rotation core, with or without a mode (servers before vectoring cores send none)', async () => {
    for (const extra of [{ mode: 'rotation', vectorConfig: null }, {}]) {
      const core = { id: 4, slug: 'ref', name: 'Ref', modelConfig: { angleBits: 12 }, limits: { maxModelMismatches: 0 }, linkProfile: { baud: 115_200 }, ...extra };
      const got = await fetchCore(serving([core]), server, 'ref');
      expect(got).toMatchObject({ id: 4, slug: 'ref', baud: 115_200, limits: { maxModelMismatches: 0 } });
      expect(got.mode).toBe('rotation');
      if (got.mode === 'rotation') expect(got.model.angleBits).toBe(12);
    }
  });
});
