import { QueryClient, QueryObserver } from '@tanstack/react-query';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { buildQueryOptions } from '../../../src/lib/resources/build-detail';
import { boardKeys } from '../../../src/lib/resources/boards';
import { buildKeys, buildsQueryOptions } from '../../../src/lib/resources/builds';
import { coreKeys } from '../../../src/lib/resources/cores';
import { serveJson } from '../../support/serve-json';

// Whole records, as the server sends them: the client checks replies against the contract.
const build = {
  id: 4,
  coreId: 7,
  core: { id: 7, name: 'Reference 16', slug: 'reference-16' },
  label: 'ref16-r4',
  sourceRevision: 'a1b2',
  toolVersion: '1.0',
  clockMHz: 100,
  notes: '',
  fileName: null,
  fileSize: null,
  sha256: null,
  createdById: 1,
  createdBy: { id: 1, name: 'Ines' },
  createdAt: '2026-03-01T09:00:00.000Z',
  updatedAt: '2026-03-01T09:00:00.000Z',
  status: 'passing',
  sessionCount: 2,
  lastSessionAt: '2026-03-02T10:00:00.000Z',
};
const other = { ...build, id: 5, coreId: 8, label: 'wide24-r1' };

const serve = (replies: Record<string, unknown>) => serveJson(replies, 'No such build');
const pathsAsked = (fetchMock: ReturnType<typeof serve>) => fetchMock.mock.calls.map((c) => c[0]);

let qc: QueryClient;
beforeEach(() => {
  qc = new QueryClient({ defaultOptions: { queries: { retry: false } } });
});
afterEach(() => {
  qc.clear();
  vi.unstubAllGlobals();
  vi.useRealTimers();
});

describe('shared build queries', () => {
  it('asks GET /api/builds for every core and ?coreId= for one, and keeps each under its own list key', async () => {
    const fetchMock = serve({ '/api/builds': { builds: [other, build] }, '/api/builds?coreId=7': { builds: [build] } });
    expect(await qc.fetchQuery(buildsQueryOptions(null))).toEqual([other, build]);
    expect(await qc.fetchQuery(buildsQueryOptions(7))).toEqual([build]);
    expect(pathsAsked(fetchMock)).toEqual(['/api/builds', '/api/builds?coreId=7']);
    expect(qc.getQueryData(buildKeys.list(7))).toEqual([build]);
    expect(qc.getQueryData(buildKeys.list(null))).toEqual([other, build]);
  });

  it('lets two readers mounted together share one request for the same list', async () => {
    const fetchMock = serve({ '/api/builds?coreId=7': { builds: [build] } });
    const [picker, filter] = await Promise.all([qc.fetchQuery(buildsQueryOptions(7)), qc.fetchQuery(buildsQueryOptions(7))]);
    expect(picker).toBe(filter);
    expect(pathsAsked(fetchMock)).toEqual(['/api/builds?coreId=7']);
  });

  it('keeps a list only for the client’s default stale time, since a build’s status follows sessions saved since', async () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(new Date('2026-01-01T00:00:00Z'));
    // The app's client holds reads for 10 s by default (src/lib/query-client.ts).
    const app = new QueryClient({ defaultOptions: { queries: { retry: false, staleTime: 10_000 } } });
    const fetchMock = serve({ '/api/builds?coreId=7': { builds: [build] } });
    await app.fetchQuery(buildsQueryOptions(7));
    vi.setSystemTime(new Date('2026-01-01T00:00:05Z'));
    await app.fetchQuery(buildsQueryOptions(7));
    expect(pathsAsked(fetchMock)).toEqual(['/api/builds?coreId=7']);
    vi.setSystemTime(new Date('2026-01-01T00:00:11Z'));
    await app.fetchQuery(buildsQueryOptions(7));
    expect(pathsAsked(fetchMock)).toEqual(['/api/builds?coreId=7', '/api/builds?coreId=7']);
    app.clear();
  });

  it('keeps the build with its duplicates under the build’s detail key, unwrapped from its reply', async () => {
    const detail = { ...build, duplicates: [{ id: 9, label: 'ref16-r4b' }] };
    const fetchMock = serve({ '/api/builds/4': { build: detail, reviews: [], standing: 'unreviewed' } });
    expect(await qc.fetchQuery(buildQueryOptions(4))).toEqual(detail);
    expect(qc.getQueryData(buildKeys.detail(4))).toEqual(detail);
    expect(pathsAsked(fetchMock)).toEqual(['/api/builds/4']);
  });

  it('throws the server’s message when a build cannot be read', async () => {
    serve({});
    await expect(qc.fetchQuery(buildQueryOptions(99))).rejects.toThrow('No such build');
  });

  it('refreshes every list, every detail and the review trails when buildKeys.all is invalidated, and no core or board', async () => {
    qc.setQueryData(buildKeys.list(null), [other, build]);
    qc.setQueryData(buildKeys.list(7), [build]);
    qc.setQueryData(buildKeys.detail(4), { ...build, duplicates: [] });
    qc.setQueryData(buildKeys.reviews(4), []);
    qc.setQueryData(coreKeys.lists(), []);
    qc.setQueryData(boardKeys.lists(), []);
    await qc.invalidateQueries({ queryKey: buildKeys.all });
    for (const key of [buildKeys.list(null), buildKeys.list(7), buildKeys.detail(4), buildKeys.reviews(4)]) expect(qc.getQueryState(key)?.isInvalidated).toBe(true);
    expect(qc.getQueryState(coreKeys.lists())?.isInvalidated).toBe(false);
    expect(qc.getQueryState(boardKeys.lists())?.isInvalidated).toBe(false);
  });

  it('refetches a list an open page watches when buildKeys.all is invalidated, and the await ends with the new data in place', async () => {
    const replies: Record<string, unknown> = { '/api/builds?coreId=7': { builds: [build] } };
    const fetchMock = serve(replies);
    // A query with a subscribed observer is active, as the bench's picker is while it is shown.
    const stop = new QueryObserver(qc, buildsQueryOptions(7)).subscribe(() => undefined);
    await vi.waitFor(() => expect(qc.getQueryData(buildKeys.list(7))).toEqual([build]));
    replies['/api/builds?coreId=7'] = { builds: [{ ...build, status: 'approved' }] };
    await qc.invalidateQueries({ queryKey: buildKeys.all });
    expect(qc.getQueryData(buildKeys.list(7))).toEqual([{ ...build, status: 'approved' }]);
    expect(pathsAsked(fetchMock)).toEqual(['/api/builds?coreId=7', '/api/builds?coreId=7']);
    stop();
  });

  it('leaves the lists and other builds alone when one build’s detail is invalidated', async () => {
    qc.setQueryData(buildKeys.list(7), [build]);
    qc.setQueryData(buildKeys.detail(4), { ...build, duplicates: [] });
    qc.setQueryData(buildKeys.detail(5), { ...other, duplicates: [] });
    await qc.invalidateQueries({ queryKey: buildKeys.detail(4) });
    expect(qc.getQueryState(buildKeys.detail(4))?.isInvalidated).toBe(true);
    expect(qc.getQueryState(buildKeys.detail(5))?.isInvalidated).toBe(false);
    expect(qc.getQueryState(buildKeys.list(7))?.isInvalidated).toBe(false);
  });
});
