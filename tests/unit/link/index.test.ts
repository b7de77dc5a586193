import { describe, it, expect } from 'vitest';
import * as link from '../../../shared/link';

describe('bench link public API', () => {
  it('exports the codec, decoder, payloads and recorder from one module', () => {
    for (const name of ['crc8', 'encodeFrame', 'FrameDecoder', 'encodeMessage', 'decodePayload', 'Recorder', 'RecordedDecoder', 'readArchive', 'replayArchive', 'Kind', 'NakReason']) {
      expect(link, name).toHaveProperty(name);
    }
  });

  it('round-trips a ONE request through the exported pieces alone', () => {
    const frames: link.DecodedFrame[] = [];
    new link.FrameDecoder({ onFrame: (f) => frames.push(f) }).push(link.encodeMessage({ kind: link.Kind.One, angleCode: 5461 }, 3, link.DEFAULT_PROFILE));
    expect(link.decodePayload(frames[0].kind, frames[0].payload, link.DEFAULT_PROFILE)).toEqual({ kind: link.Kind.One, angleCode: 5461 });
  });
});
