import { QueryClient } from '@tanstack/react-query';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { boardKeys, boardsQueryOptions } from '../../../src/lib/resources/boards';
import { coreQueryOptions } from '../../../src/lib/resources/core-detail';
import { coreKeys, coresQueryOptions } from '../../../src/lib/resources/cores';
import { modelConfigSchema } from '../../../shared/numeric/model-config';
import { serveJson } from '../../support/serve-json';

// Whole records, as the server sends them: the client checks replies against the contract.
const at = '2026-03-01T09:00:00.000Z';
const core = { id: 7, name: 'Reference 16', slug: 'reference-16', linkProfile: { baud: 3_000_000, crc: 'CRC-8/SMBUS' }, modelConfig: modelConfigSchema.parse({}), limits: {}, baselineSessionId: null, createdAt: at, updatedAt: at };
const board = { id: 2, name: 'Bench A', serial: 'S-1', fpgaPart: '', adapter: '', location: '', createdAt: at, updatedAt: at };

const serve = serveJson;

let qc: QueryClient;
beforeEach(() => {
  qc = new QueryClient({ defaultOptions: { queries: { retry: false } } });
});
afterEach(() => {
  qc.clear();
  vi.unstubAllGlobals();
});

describe('shared core and board queries', () => {
  it('fetches the cores list once for every reader within the stale time and unwraps it from its reply', async () => {
    const fetchMock = serve({ '/api/cores': { cores: [core] } });
    const first = await qc.fetchQuery(coresQueryOptions());
    const second = await qc.fetchQuery(coresQueryOptions());
    expect(first).toEqual([core]);
    expect(second).toBe(first);
    expect(fetchMock.mock.calls.map((c) => c[0])).toEqual(['/api/cores']);
  });

  it('keeps the whole core reply (core, watchers, watching) under the core’s detail key', async () => {
    const reply = { core, watchers: [{ id: 1, name: 'Ada' }], watching: true };
    const fetchMock = serve({ '/api/cores/7': reply });
    await qc.fetchQuery(coreQueryOptions(7));
    expect(qc.getQueryData(coreKeys.detail(7))).toEqual(reply);
    expect(fetchMock.mock.calls.map((c) => c[0])).toEqual(['/api/cores/7']);
  });

  it('fetches the boards list from GET /api/boards and unwraps it', async () => {
    serve({ '/api/boards': { boards: [board] } });
    expect(await qc.fetchQuery(boardsQueryOptions())).toEqual([board]);
  });

  it('throws the server’s message when the list cannot be read', async () => {
    serve({});
    await expect(qc.fetchQuery(coresQueryOptions())).rejects.toThrow('No such path');
  });

  it('refreshes the list, every detail and the golden vectors of a core when coreKeys.all is invalidated, and no board', async () => {
    qc.setQueryData(coreKeys.lists(), [core]);
    qc.setQueryData(coreKeys.detail(7), { core, watchers: [], watching: false });
    qc.setQueryData(coreKeys.goldenVectors(7), { sets: [] });
    qc.setQueryData(boardKeys.lists(), [board]);
    await qc.invalidateQueries({ queryKey: coreKeys.all });
    for (const key of [coreKeys.lists(), coreKeys.detail(7), coreKeys.goldenVectors(7)]) expect(qc.getQueryState(key)?.isInvalidated).toBe(true);
    expect(qc.getQueryState(boardKeys.lists())?.isInvalidated).toBe(false);
  });

  it('leaves the list and other cores alone when one core’s detail is invalidated', async () => {
    qc.setQueryData(coreKeys.lists(), [core]);
    qc.setQueryData(coreKeys.detail(7), { core, watchers: [], watching: false });
    qc.setQueryData(coreKeys.detail(8), { core: { ...core, id: 8 }, watchers: [], watching: false });
    await qc.invalidateQueries({ queryKey: coreKeys.detail(7) });
    expect(qc.getQueryState(coreKeys.detail(7))?.isInvalidated).toBe(true);
    expect(qc.getQueryState(coreKeys.detail(8))?.isInvalidated).toBe(false);
    expect(qc.getQueryState(coreKeys.lists())?.isInvalidated).toBe(false);
  });

  it('refreshes the board register and a board’s page when boardKeys.all is invalidated', async () => {
    qc.setQueryData(boardKeys.lists(), [board]);
    qc.setQueryData(boardKeys.detail(2), board);
    await qc.invalidateQueries({ queryKey: boardKeys.all });
    expect(qc.getQueryState(boardKeys.lists())?.isInvalidated).toBe(true);
    expect(qc.getQueryState(boardKeys.detail(2))?.isInvalidated).toBe(true);
  });
});
