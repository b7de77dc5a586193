import { Kind } from '../../shared/link/kinds';
import { encodeMessage } from '../../shared/link/payloads';
import { RecordedDecoder, Recorder } from '../../shared/link/recorder';
import type { WireProfile } from '../../shared/link/wire-profile';
import { createCordicModel, type ModelConfigInput } from '../../shared/numeric';

export const P16: WireProfile = { angleFormat: 'turn', angleBits: 16, outBits: 16 };

/** Record a capture the way the bench records one: `script` pushes bytes each way in order. */
export function capture(script: (tx: (b: Uint8Array) => void, rx: (b: Uint8Array) => void) => void, label = 'test capture'): Uint8Array {
  let t = 0;
  const recorder = new Recorder({ label, accept: { 'to-host': 'replies', 'to-device': 'requests' } });
  const side = (direction: 'to-host' | 'to-device') => new RecordedDecoder({ recorder, direction, nowMs: () => (t += 1), onFrame: () => {} });
  const host = side('to-host');
  const device = side('to-device');
  script((b) => device.push(b), (b) => host.push(b));
  host.finish();
  device.finish();
  return recorder.toArchive();
}

/** A RESULTS frame answering `codes` as the model of `config` does, `cosDelta` added to every cos. */
export function modelResults(tag: number, firstIndex: number, codes: number[], config: ModelConfigInput = {}, cosDelta = 0, p = P16): Uint8Array {
  const model = createCordicModel(config);
  const out = codes.map((c) => model.evaluate(c));
  return encodeMessage({ kind: Kind.Results, firstIndex, cos: Int32Array.from(out, (o) => o.cos + cosDelta), sin: Int32Array.from(out, (o) => o.sin) }, tag, p);
}

/** A capture of one LIST request answered in frames of up to 60 results. */
export function listCapture(codes: number[], config: ModelConfigInput = {}, cosDelta = 0): Uint8Array {
  return capture((tx, rx) => {
    for (let at = 0, tag = 1; at < codes.length; at += 60, tag++) {
      const part = codes.slice(at, at + 60);
      tx(encodeMessage({ kind: Kind.List, angleCodes: part }, tag, P16));
      rx(modelResults(tag, 0, part, config, cosDelta));
    }
  });
}
