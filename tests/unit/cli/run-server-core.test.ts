import { describe, expect, it } from 'vitest';
import { fetchCore, ServerError } from '../../../cli/run-server';

// The runner reads the core's model from GET /api/cores; a vectoring core has none it can run.
const serving = (cores: unknown[]) => (async () => new Response(JSON.stringify({ cores }), { status: 200, headers: { 'content-type': 'application/json' } })) as unknown as typeof fetch;
const server = { url: 'http://lab.test', token: 'ab_x' };

describe('fetchCore', () => {
  it('refuses a vectoring core by name, where it would have run a rotation plan against it', async () => {
    const core = { id: 3, slug: 'phase-det', name: 'Phase detector', mode: 'vectoring', modelConfig: null, vectorConfig: {}, limits: {}, linkProfile: {} };
    await expect(fetchCore(serving([core]), server, 'phase-det')).rejects.toThrow(ServerError);
    await expect(fetchCore(serving([core]), server, 'phase-det')).rejects.toThrow('core "phase-det" is a vectoring core: this runner runs rotation cores only');
  });

  it('still reads a rotation core, with or without a mode (servers before vectoring cores send none)', async () => {
    for (const extra of [{ mode: 'rotation', vectorConfig: null }, {}]) {
      const core = { id: 4, slug: 'ref', name: 'Ref', modelConfig: { angleBits: 12 }, limits: { maxModelMismatches: 0 }, linkProfile: { baud: 115_200 }, ...extra };
      const got = await fetchCore(serving([core]), server, 'ref');
      expect(got).toMatchObject({ id: 4, slug: 'ref', baud: 115_200, limits: { maxModelMismatches: 0 } });
      expect(got.model.angleBits).toBe(12);
    }
  });
});
