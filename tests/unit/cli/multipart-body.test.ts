// The runner's upload body, read back by an independent parser: the multipart/form-data reader
// of Node's own fetch (undici's Response.formData).
import { randomBytes } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { multipartBody } from '../../../cli/multipart-body';

async function bytesOf(chunks: AsyncGenerator<Uint8Array>): Promise<Buffer> {
  const out: Uint8Array[] = [];
  for await (const c of chunks) out.push(c);
  return Buffer.concat(out);
}

describe('multipartBody', () => {
  it('is read back field for field and byte for byte, its length the one it declares', async () => {
    const samples = randomBytes(3 * 2 ** 20 + 7); // crosses the 1 MiB slices
    const session = JSON.stringify({ coreSlug: 'cordic-16', note: 'π/4 — “quoted”\r\nline' });
    const body = multipartBody([
      { name: 'session', value: session },
      { name: 'samples', filename: 'samples.bin', type: 'application/octet-stream', bytes: samples },
      { name: 'archive', filename: 'capture.abrc', type: 'application/octet-stream', bytes: new Uint8Array(0) },
    ]);
    const sent = await bytesOf(body.chunks());
    expect(sent.length).toBe(body.length);
    const form = await new Response(new Uint8Array(sent), { headers: { 'content-type': body.contentType } }).formData();
    expect(form.get('session')).toBe(session);
    const got = form.get('samples') as File;
    expect(got.name).toBe('samples.bin');
    expect(got.type).toBe('application/octet-stream');
    expect(Buffer.from(await got.arrayBuffer()).equals(samples)).toBe(true);
    expect((form.get('archive') as File).size).toBe(0);
    // A retry sends the same bytes again.
    expect((await bytesOf(body.chunks())).equals(sent)).toBe(true);
  });

  it('escapes quotes and line breaks in names as browsers do, and draws a new boundary each time', async () => {
    const a = multipartBody([{ name: 'a"b\r\nc', value: 'x' }]);
    const b = multipartBody([{ name: 'a', value: 'x' }]);
    expect((await bytesOf(a.chunks())).toString()).toContain('Content-Disposition: form-data; name="a%22b%0D%0Ac"\r\n\r\nx\r\n');
    expect(a.contentType).toMatch(/^multipart\/form-data; boundary=anglebench-[0-9a-f]{32}$/);
    expect(a.contentType).not.toBe(b.contentType);
  });
});
