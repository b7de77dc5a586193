import { describe, expect, it } from 'vitest';
import { samplesFromArchive } from '../../../shared/link-engine/archive-samples';
import { Kind } from '../../../shared/link/kinds';
import { encodeMessage, sweepAngleCode, type DeviceInfo } from '../../../shared/link/payloads';
import { createCordicModel } from '../../../shared/numeric';
import { capture, modelResults, P16 } from '../../support/capture';

const p16 = P16;
const info: DeviceInfo = { version: 1, angleFormat: 'turn', angleBits: 16, angleFrac: 0, outBits: 16, outFrac: 14, iterations: 16, queueDepth: 256, buildId: 7, clockKHz: 100000, name: 'test board' };
const model = createCordicModel({});
const results = (tag: number, firstIndex: number, codes: number[]) => modelResults(tag, firstIndex, codes);

describe('samplesFromArchive', () => {
  it('pairs LIST and SWEEP requests with their RESULTS by TAG, in request order, first answer kept', () => {
    const list = [100, 40000, 7];
    const sweep = { start: 65530, step: 3, count: 5 };
    const sweepCodes = Array.from({ length: sweep.count }, (_, i) => sweepAngleCode(sweep.start, sweep.step, i, p16));
    const bytes = capture((tx, rx) => {
      tx(encodeMessage({ kind: Kind.Hello }, 1, p16));
      rx(encodeMessage({ kind: Kind.Info, info }, 1, p16));
      tx(encodeMessage({ kind: Kind.List, angleCodes: list }, 2, p16));
      tx(encodeMessage({ kind: Kind.Sweep, ...sweep }, 3, p16));
      rx(results(3, 2, sweepCodes.slice(2)));
      rx(results(2, 0, list));
      rx(results(3, 0, sweepCodes.slice(0, 2)));
      // A late duplicate of the first answer to the list: ignored.
      rx(encodeMessage({ kind: Kind.Results, firstIndex: 0, cos: Int32Array.of(1), sin: Int32Array.of(2) }, 2, p16));
    });
    const s = samplesFromArchive(bytes);
    const codes = [...list, ...sweepCodes];
    expect(Array.from(s.codes)).toEqual(codes);
    expect(Array.from(s.cos)).toEqual(codes.map((c) => model.evaluate(c).cos));
    expect(Array.from(s.sin)).toEqual(codes.map((c) => model.evaluate(c).sin));
    expect(s.info?.name).toBe('test board');
    expect(s.label).toBe('test capture');
    expect(s.incompleteRequests).toBe(0);
    expect(s.checkFailures).toBe(0);
  });

  it('counts replies with a bad CHECK, leaves their codes out and reports the request incomplete', () => {
    const bytes = capture((tx, rx) => {
      tx(encodeMessage({ kind: Kind.List, angleCodes: [1, 2] }, 9, p16));
      const bad = results(9, 1, [2]);
      bad[bad.length - 1] ^= 0xff;
      rx(results(9, 0, [1]));
      rx(bad);
    });
    const s = samplesFromArchive(bytes);
    expect(Array.from(s.codes)).toEqual([1]);
    expect(s.checkFailures).toBe(1);
    expect(s.incompleteRequests).toBe(1);
  });

  it('treats a resent request with the same TAG as a retry, not a second request', () => {
    const bytes = capture((tx, rx) => {
      const req = encodeMessage({ kind: Kind.One, angleCode: 5 }, 4, p16);
      tx(req);
      tx(req);
      rx(results(4, 0, [5]));
      rx(results(4, 0, [5]));
      // Once answered, the same request again is a new one.
      tx(req);
      rx(results(4, 0, [5]));
    });
    expect(Array.from(samplesFromArchive(bytes).codes)).toEqual([5, 5]);
  });

  it('refuses a file that is not an archive', () => {
    expect(() => samplesFromArchive(new TextEncoder().encode('angle_code,cos_code,sin_code\n'))).toThrow(/magic/i);
  });
});
