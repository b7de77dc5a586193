// The capture archive reader fed random bytes and damaged archives: it reads them or refuses
// them with an ArchiveError, and never throws anything else.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ArchiveError, readArchive } from '../../shared/link/archive';
import { RecordedDecoder, Recorder, replayArchive } from '../../shared/link/recorder';
import { seededRandom } from '../../mock-device/line-faults';
import { fuzzStream, pushInChunks } from './support/wire-streams';

/** A real archive: both directions of a fuzzed stream recorded in chunks, with a profile change. */
function sampleArchive(bytesPerDirection: number, seed: number): Uint8Array {
  const recorder = new Recorder({ label: 'robustness: bench 2, build 7' });
  let t = 0;
  const now = () => (t += 0.25);
  for (const direction of ['to-device', 'to-host'] as const) {
    const rec = new RecordedDecoder({ recorder, direction, nowMs: now, onFrame: () => {} });
    const stream = fuzzStream({ seed: seed + (direction === 'to-host' ? 1 : 0), totalBytes: bytesPerDirection, mode: 'open' });
    const half = Math.floor(stream.bytes.length / 2);
    pushInChunks(stream.bytes.subarray(0, half), (c) => rec.push(c), seed, 300);
    rec.setProfile({ angleFormat: 'rad', angleBits: 24, outBits: 18 });
    pushInChunks(stream.bytes.subarray(half), (c) => rec.push(c), seed + 2, 300);
    rec.finish();
  }
  return recorder.toArchive();
}

/** readArchive's outcome: 'read', 'refused' (an ArchiveError) or the other error it threw. */
function outcome(bytes: Uint8Array): 'read' | 'refused' | Error {
  try {
    readArchive(bytes);
    return 'read';
  } catch (e) {
    return e instanceof ArchiveError ? 'refused' : (e as Error);
  }
}

/** One seeded edit: overwrite, insert or remove a byte, or cut the archive short. */
function mutate(src: Uint8Array, random: () => number): Uint8Array {
  const at = Math.floor(random() * src.length);
  const b = Math.floor(random() * 256);
  switch (Math.floor(random() * 4)) {
    case 0: {
      const out = src.slice();
      out[at] = b;
      return out;
    }
    case 1: {
      const out = new Uint8Array(src.length + 1);
      out.set(src.subarray(0, at));
      out[at] = b;
      out.set(src.subarray(at), at + 1);
      return out;
    }
    case 2: {
      const out = new Uint8Array(src.length - 1);
      out.set(src.subarray(0, at));
      out.set(src.subarray(at + 1), at);
      return out;
    }
    default:
      return src.slice(0, at);
  }
}

const archive = sampleArchive(3000, 5);

describe('the archive reader under fuzzing', () => {
  it('reads the undamaged sample archive and replays it', () => {
    expect(outcome(archive)).toBe('read');
    expect(replayArchive(archive).frames.length).toBeGreaterThan(10);
  });

  it('fast-check: random bytes, with or without a valid magic and version, are read or refused with an ArchiveError', () => {
    const head = archive.subarray(0, 5);
    fc.assert(
      fc.property(fc.boolean(), fc.uint8Array({ maxLength: 600 }), (withHead, tail) => {
        const bytes = withHead ? Uint8Array.from([...head, ...tail]) : tail;
        expect(outcome(bytes)).not.toBeInstanceOf(Error);
      }),
      { seed: 77, numRuns: 5000 },
    );
  });

  it('10,000 seeded single edits of a real archive: each is read or refused with an ArchiveError', () => {
    const random = seededRandom(2026);
    const others: string[] = [];
    let read = 0;
    for (let i = 0; i < 10_000; i++) {
      const damaged = mutate(archive, random);
      const r = outcome(damaged);
      if (r === 'read') {
        read++;
        // What reads must also replay: the header and records are consistent enough for decoders.
        replayArchive(damaged);
      } else if (r instanceof Error) others.push(`${r.name}: ${r.message}`);
    }
    expect(others).toEqual([]);
    console.info(`[archive fuzz] 10,000 edits of a ${archive.length}-byte archive: ${read} still read (edits inside chunk bytes or times), the rest refused`);
  });

  // Found by this suite: a varint longer than 8 continuation bytes once escaped as a RangeError.
  it('refuses an over-long varint (ten 0xFF bytes as a chunk length) with an ArchiveError', () => {
    const empty = new Recorder().toArchive();
    const headerEnd = 7 + (empty[5] | (empty[6] << 8));
    const chunkRecord = [0x01, ...new Array<number>(8).fill(0), ...new Array<number>(10).fill(0xff), 0x01];
    expect(outcome(Uint8Array.from([...empty.subarray(0, headerEnd), ...chunkRecord]))).toBe('refused');
  });

  it('fast-check: up to eight edits of a real archive are read or refused with an ArchiveError', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 8 }), fc.integer({ min: 0, max: 2 ** 31 }), (edits, seed) => {
        const random = seededRandom(seed);
        let bytes = archive;
        for (let k = 0; k < edits && bytes.length > 0; k++) bytes = mutate(bytes, random);
        expect(outcome(bytes)).not.toBeInstanceOf(Error);
      }),
      { seed: 78, numRuns: 3000 },
    );
  });
});
