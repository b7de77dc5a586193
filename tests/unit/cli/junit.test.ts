import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { runRunCommand } from '../../../cli/run';
import { xmlEscape } from '../../../cli/junit';
import { defaultBoardSettings } from '../../../mock-device/board-session';
import { parseCoreFault } from '../../../mock-device/faulty-core';
import { startMockServer, type MockServer } from '../../../mock-device/ws-server';
import { childrenNamed, parseXml, type XmlElement } from '../../support/xml';
import { captureIo } from './run-support';
import { createInterrupt } from '../../../cli/interrupt';

// `run --junit FILE`: the verdict as JUnit XML, read back with a strict parser.

let faulty: MockServer;
beforeAll(async () => {
  faulty = await startMockServer({ ...defaultBoardSettings(), baud: 12_000_000, coreFault: parseCoreFault('sign:5') }, 0, '127.0.0.1', () => undefined);
});
afterAll(async () => {
  await faulty.close();
});

/** Runs in-process, keeping what would be written to files. */
async function run(args: string[]) {
  const files = new Map<string, string>();
  const io = captureIo();
  const status = await runRunCommand(args, io, {
    writeFile: (path, bytes) => files.set(path, new TextDecoder().decode(bytes)),
    interrupt: createInterrupt(),
  });
  return { status, files, io };
}

const properties = (suite: XmlElement) => Object.fromEntries(childrenNamed(childrenNamed(suite, 'properties')[0], 'property').map((p) => [p.attributes.name, p.attributes.value]));

describe('run --junit', { timeout: 30_000 }, () => {
  it('writes one test case per limit: failures carry the measured and allowed values, unmeasurable ones are skipped', async () => {
    // sign:5 turns iteration 5 the wrong way: thousands of LSB off, every code differs from the model.
    const limits = JSON.stringify({ maxModelMismatches: 0, maxLinkErrors: 0, maxAbsErrorLsb: 4, minSfdrDb: 80 });
    const { status, files } = await run(['--device', faulty.url, '--baud', '12000000', '--plan', 'sweep:0,64,1024', '--core', 'reference-16', '--limits', limits, '--junit', 'report.xml', '--json']);
    expect(status).toBe(1);
    const root = parseXml(files.get('report.xml')!);
    expect(root.name).toBe('testsuites');
    const [suite] = childrenNamed(root, 'testsuite');
    expect(suite.attributes).toMatchObject({ name: 'anglebench run: reference-16', tests: '4', failures: '2', errors: '0', skipped: '1' });
    expect(Number(suite.attributes.time)).toBeGreaterThan(0);

    const cases = childrenNamed(suite, 'testcase');
    expect(cases.map((c) => c.attributes.name)).toEqual([
      'maxAbsErrorLsb: Largest |error|',
      'minSfdrDb: SFDR',
      'maxModelMismatches: Model mismatches',
      'maxLinkErrors: Link errors',
    ]);
    expect(cases.every((c) => c.attributes.classname === 'anglebench.reference-16')).toBe(true);
    const byKey = Object.fromEntries(cases.map((c) => [c.attributes.name.split(':')[0], c]));

    const [absFailure] = childrenNamed(byKey.maxAbsErrorLsb, 'failure');
    expect(absFailure.attributes.message).toMatch(/^measured \d+(\.\d+)? LSB, allowed at most 4 LSB$/);
    expect(Number(/measured (\S+)/.exec(absFailure.attributes.message)![1])).toBeGreaterThan(4);
    expect(absFailure.text).toContain(absFailure.attributes.message);

    const [mismatchFailure] = childrenNamed(byKey.maxModelMismatches, 'failure');
    expect(mismatchFailure.attributes.message).toBe('measured 1024 results, allowed at most 0 results');

    expect(childrenNamed(byKey.minSfdrDb, 'skipped')[0].attributes.message).toBe('not measured (needs a complete tone plan); allowed at least 80 dB');
    expect(byKey.maxLinkErrors.children).toEqual([]); // passed: a clean line

    const props = properties(suite);
    expect(props).toMatchObject({ core: 'reference-16', device: faulty.url, plan: 'sweep:0,64,1024', status: 'complete', answered: '1024 of 1024' });
    expect(props.session).toBeUndefined(); // no server: no session
  });

  it.each([
    ['the address the runner was given, when the server names none', null],
    ['the server\u2019s own public address for it', 'https://bench.lab.example/sessions/41'],
  ])('names the saved session\u2019s address when the run is uploaded: %s', async (_what, publicUrl) => {
    const server: Server = createServer((req, res) => {
      if (req.method === 'GET' && req.url === '/api/cores') {
        const core = { id: 3, slug: 'reference-16', name: 'Reference 16', linkProfile: { baud: 12_000_000, crc: 'CRC-8/SMBUS' }, modelConfig: {}, limits: { maxModelMismatches: 0 } };
        res.writeHead(200, { 'content-type': 'application/json' }).end(JSON.stringify({ cores: [core] }));
        return;
      }
      req.resume();
      req.on('end', () => res.writeHead(201, { 'content-type': 'application/json' }).end(JSON.stringify(publicUrl ? { id: 41, url: publicUrl } : { session: { id: 41 } })));
    });
    await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
    const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    try {
      const { status, files } = await run(['--device', faulty.url, '--plan', 'edges', '--core', 'reference-16', '--server', url, '--token', 'a-token', '--junit', 'ci/report.xml']);
      expect(status).toBe(1);
      const [suite] = childrenNamed(parseXml(files.get('ci/report.xml')!), 'testsuite');
      expect(properties(suite).session).toBe(publicUrl ?? `${url}/sessions/41`);
      expect(childrenNamed(suite, 'testcase').map((c) => [c.attributes.name, childrenNamed(c, 'failure').length])).toEqual([['maxModelMismatches: Model mismatches', 1]]);
    } finally {
      server.close();
    }
  });

  it('exits 2 naming the file when the report cannot be written', async () => {
    const io = captureIo();
    const status = await runRunCommand(['--device', faulty.url, '--plan', 'edges', '--core', 'reference-16', '--junit', '/nonexistent-dir/report.xml'], io, { interrupt: createInterrupt() });
    expect(status).toBe(2);
    expect(io.err).toMatch(/^error: cannot write the JUnit report to \/nonexistent-dir\/report\.xml: ENOENT$/m);
  });
});

describe('JUnit text', () => {
  it('escapes the XML specials and drops characters XML 1.0 forbids, so any label reads back unchanged', () => {
    const label = 'core <A&B> "q" \'s\' \u0001bell\u0007';
    const doc = parseXml(`<p v="${xmlEscape(label)}">${xmlEscape(label)}</p>`);
    expect(doc.attributes.v).toBe('core <A&B> "q" \'s\' bell');
    expect(doc.text).toBe('core <A&B> "q" \'s\' bell');
  });

  it('the test\u2019s parser refuses what is not well formed', () => {
    expect(() => parseXml('<a><b></a></b>')).toThrow();
    expect(() => parseXml('<a x="1 & 2"/>')).toThrow();
    expect(() => parseXml('<a/><b/>')).toThrow();
  });
});
