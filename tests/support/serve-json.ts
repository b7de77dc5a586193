import { vi } from 'vitest';

/**
 * Stubs the global fetch: each path gets its canned JSON reply (200), any other path the
 * server's 404 error envelope with `notFound` as its message. Returns the mock, so a test can
 * read which paths were asked for.
 */
export function serveJson(replies: Record<string, unknown>, notFound = 'No such path') {
  const fetchMock = vi.fn(async (path: string) => {
    if (!(path in replies)) return new Response(JSON.stringify({ error: { code: 'not_found', message: notFound } }), { status: 404 });
    return new Response(JSON.stringify(replies[path]), { status: 200, headers: { 'content-type': 'application/json' } });
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}
