import { afterEach, describe, expect, it, vi } from 'vitest';
import { ApiError, apiReply } from '../../../src/lib/api';
import { fetchBytes } from '../../../src/features/sessions/api/fetch-bytes';
import { sessionDetailReply } from '../../../shared/contract/sessions';
import { serveJson } from '../../support/serve-json';

// A failed reply becomes an ApiError from its `{ error }` body (the contract's errorReply), or
// from its status line when the body is not one (a proxy's HTML page, say).
afterEach(() => vi.unstubAllGlobals());

const caught = (p: Promise<unknown>) => p.then(() => null, (e: unknown) => e);

describe('failed replies', () => {
  it('carry the server’s code and message', async () => {
    serveJson({}, 'Session not found');
    const err = await caught(apiReply(sessionDetailReply, '/api/sessions/9'));
    expect(err).toBeInstanceOf(ApiError);
    expect(err).toMatchObject({ status: 404, code: 'not_found', message: 'Session not found' });
    // The binary downloads read errors the same way.
    expect(await caught(fetchBytes('/api/sessions/9/samples'))).toMatchObject({ status: 404, code: 'not_found', message: 'Session not found' });
  });

  it('fall back to the status line when the body is not an error reply', async () => {
    vi.stubGlobal('fetch', vi.fn(async () => new Response('<html>upstream down</html>', { status: 502, statusText: 'Bad Gateway' })));
    expect(await caught(apiReply(sessionDetailReply, '/api/sessions/9'))).toMatchObject({ status: 502, code: 'http_502', message: '502 Bad Gateway' });
    expect(await caught(fetchBytes('/api/sessions/9/samples'))).toMatchObject({ status: 502, code: 'http_502', message: '502 Bad Gateway' });
  });
});
