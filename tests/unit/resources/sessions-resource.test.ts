import { QueryClient } from '@tanstack/react-query';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { ContractError } from '../../../shared/contract/check';
import { apiReply } from '../../../src/lib/api';
import { boardSessionsQueryOptions } from '../../../src/features/boards/api/get-board-sessions';
import { buildSessionsQueryOptions } from '../../../src/features/builds/api/get-build-sessions';
import { sessionDetailQueryOptions, sessionKeys, sessionListQueryOptions, sessionListSearch } from '../../../src/lib/resources/sessions';
import { sessionDetailReply } from '../../../shared/contract/sessions';
import { serveJson } from '../../support/serve-json';

/** A session as GET /api/sessions/:id answers it (the shape the server test reads back). */
const session = {
  id: 5,
  coreId: 7,
  buildId: 4,
  boardId: 2,
  operatorId: 1,
  startedAt: '2026-03-01T09:00:00.000Z',
  endedAt: null,
  plan: { kind: 'sweep', first: 0, count: 256, step: 256 },
  transport: { kind: 'serial', baud: 3_000_000 },
  deviceInfo: null,
  stats: { count: 256 },
  verdict: { maxAbsErrorLsb: { limit: 4, measured: 1.5, pass: true } },
  profile: null,
  passed: true,
  regression: false,
  sampleCount: 256,
  notes: '',
  tags: [],
  createdAt: '2026-03-01T09:01:00.000Z',
  updatedAt: '2026-03-01T09:01:00.000Z',
  core: { id: 7, name: 'Reference 16', slug: 'reference-16' },
  build: { id: 4, label: 'ref16-r4' },
  board: { id: 2, name: 'Rig 2' },
  operator: { id: 1, name: 'Ines' },
  hasArchive: false,
};
const page = (items: unknown[]) => ({ items, total: items.length, page: 1, pageSize: 25 });

let qc: QueryClient;
beforeEach(() => {
  qc = new QueryClient({ defaultOptions: { queries: { retry: false } } });
});
afterEach(() => {
  qc.clear();
  vi.unstubAllGlobals();
  vi.unstubAllEnvs();
});

describe('apiReply: the client checks replies against the contract in development', () => {
  it('returns a reply that matches, as received', async () => {
    serveJson({ '/api/sessions/5': { session } });
    expect(await apiReply(sessionDetailReply, '/api/sessions/5')).toEqual({ session });
  });

  it('fails a reply whose field was renamed, with a message naming the missing field', async () => {
    const { startedAt, ...rest } = session;
    serveJson({ '/api/sessions/5': { session: { ...rest, started: startedAt } } });
    const err = await apiReply(sessionDetailReply, '/api/sessions/5').catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ContractError);
    expect((err as ContractError).message).toMatch(/^The reply to GET \/api\/sessions\/5 does not match its contract: session\.startedAt: /);
    expect((err as ContractError).issues.map((i) => i.path)).toEqual(['session.startedAt']);
  });

  it('does not check in a production build', async () => {
    vi.stubEnv('DEV', false);
    const { startedAt: _gone, ...rest } = session;
    serveJson({ '/api/sessions/5': { session: rest } });
    expect(await apiReply(sessionDetailReply, '/api/sessions/5')).toEqual({ session: rest });
  });
});

describe('the sessions resource', () => {
  it('builds list queries with their parameters in one order, whatever order they are given in', () => {
    expect(sessionListSearch({ pageSize: 20, sort: '-startedAt', boardId: 2, page: 3 })).toBe('boardId=2&sort=-startedAt&page=3&pageSize=20');
    expect(sessionKeys.list({ page: 1, coreId: 7 })).toEqual(sessionKeys.list({ coreId: 7, page: 1 }));
  });

  it('keeps the board and build pages’ lists under the one sessions root, so a saved session refreshes them', async () => {
    const fetchMock = serveJson({
      '/api/sessions?boardId=2&sort=-startedAt&page=1&pageSize=20': page([session]),
      '/api/sessions?buildId=4&sort=-startedAt&pageSize=100': page([session]),
    });
    await qc.fetchQuery(boardSessionsQueryOptions(2, 1));
    await qc.fetchQuery(buildSessionsQueryOptions(4));
    expect(fetchMock).toHaveBeenCalledTimes(2);
    qc.getQueryCache().findAll({ queryKey: sessionKeys.all }).forEach((q) => expect(q.isStale()).toBe(false));
    await qc.invalidateQueries({ queryKey: sessionKeys.all });
    expect(qc.getQueryCache().findAll({ queryKey: sessionKeys.lists() }).map((q) => q.isStale())).toEqual([true, true]);
  });

  it('serves a session’s page and its core’s baseline panel from one detail request', async () => {
    const fetchMock = serveJson({ '/api/sessions/5': { session } });
    const [a, b] = await Promise.all([qc.fetchQuery(sessionDetailQueryOptions(5)), qc.fetchQuery(sessionDetailQueryOptions(5))]);
    expect(a).toBe(b);
    expect(fetchMock.mock.calls.map((c) => c[0])).toEqual(['/api/sessions/5']);
  });

  it('reads a list page through the contract, failing one that lost its total', async () => {
    serveJson({ '/api/sessions?coreId=7': { items: [session], page: 1, pageSize: 25 } });
    await expect(qc.fetchQuery(sessionListQueryOptions({ coreId: 7 }))).rejects.toThrow(/: total: /);
  });
});
