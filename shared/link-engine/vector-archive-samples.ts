// A vectoring run's answers rebuilt from a recorder archive: the vectors the host sent (VEC_ONE,
// VEC_LIST, VEC_GRID) paired by TAG with the VEC_RESULTS the board returned, in request order; a
// request answered twice (a retry whose first answer arrived late) keeps its first answer. The
// rotating capture's counterpart is archive-samples.ts.
import { decodePayload, gridVector, Kind, PayloadError, profileFromInfo, replayArchive, vectorWireProfile, type VectoringFormats, type WireProfile } from '../link';
import type { VectorSamples } from './vector-sample-pack';

export interface VectorArchiveSamples extends VectorSamples {
  label: string;
  /** Requests the capture holds only part of the answers to. */
  incompleteRequests: number;
  /** The formats of the capture's MODE_INFO (null: none seen). */
  formats: VectoringFormats | null;
  /** Board-to-host frames refused for a bad CHECK: the link errors of the capture. */
  checkFailures: number;
}

interface PendingRequest {
  vector: (i: number) => { x: number; y: number };
  count: number;
  angle: Int32Array;
  magnitude: Int32Array;
  got: Uint8Array;
}

/** @throws ArchiveError for a file that is not a readable archive. */
export function vectorSamplesFromArchive(bytes: Uint8Array): VectorArchiveSamples {
  const { archive, frames, skips } = replayArchive(bytes);
  const checkFailures = skips.filter((s) => s.direction === 'to-host' && s.event.reason === 'bad-check').length;
  let profile: WireProfile = archive.header.profile;
  const requests: PendingRequest[] = [];
  const byTag = new Map<number, PendingRequest>();
  let formats: VectoringFormats | null = null;

  for (const { direction, frame } of frames) {
    let m;
    try {
      m = decodePayload(frame.kind, frame.payload, profile);
    } catch (err) {
      if (err instanceof PayloadError) continue; // the engine refused it on the bench as well
      throw err;
    }
    if (direction === 'to-device') {
      let vector: PendingRequest['vector'] | null = null;
      let count = 0;
      if (m.kind === Kind.VecOne) [vector, count] = [() => ({ x: m.x, y: m.y }), 1];
      else if (m.kind === Kind.VecList) [vector, count] = [(i) => ({ x: m.xs[i], y: m.ys[i] }), m.xs.length];
      else if (m.kind === Kind.VecGrid) {
        const p = profile;
        [vector, count] = [(i) => gridVector(m, i, p), m.nx * m.ny];
      }
      if (!vector) continue;
      const previous = byTag.get(frame.tag);
      const first = vector(0);
      const retry = previous && previous.count === count && previous.vector(0).x === first.x && previous.vector(0).y === first.y && previous.got.includes(0);
      if (retry) continue;
      const request = { vector, count, angle: new Int32Array(count), magnitude: new Int32Array(count), got: new Uint8Array(count) };
      requests.push(request);
      byTag.set(frame.tag, request);
    } else if (m.kind === Kind.Info) {
      profile = { ...profileFromInfo(m.info), ...(profile.vector ? { vector: profile.vector } : {}) };
    } else if (m.kind === Kind.ModeInfo) {
      // The vectoring formats size the VEC_* payloads from here on, as on the bench.
      if (m.modes.vectoring) {
        formats = m.modes.vectoring;
        profile = { ...profile, vector: vectorWireProfile(formats) };
      }
    } else if (m.kind === Kind.VecResults) {
      const request = byTag.get(frame.tag);
      if (!request) continue;
      for (let k = 0; k < m.angle.length; k++) {
        const i = m.firstIndex + k;
        if (i >= request.count || request.got[i]) continue;
        request.angle[i] = m.angle[k];
        request.magnitude[i] = m.magnitude[k];
        request.got[i] = 1;
      }
    }
  }

  let total = 0;
  let incompleteRequests = 0;
  for (const r of requests) {
    let n = 0;
    for (let i = 0; i < r.count; i++) n += r.got[i];
    total += n;
    if (n < r.count) incompleteRequests++;
  }
  const out: VectorArchiveSamples = { xs: new Int32Array(total), ys: new Int32Array(total), angles: new Int32Array(total), magnitudes: new Int32Array(total), label: archive.header.label, incompleteRequests, formats, checkFailures };
  let at = 0;
  for (const r of requests) {
    for (let i = 0; i < r.count; i++) {
      if (!r.got[i]) continue;
      const v = r.vector(i);
      out.xs[at] = v.x;
      out.ys[at] = v.y;
      out.angles[at] = r.angle[i];
      out.magnitudes[at] = r.magnitude[i];
      at++;
    }
  }
  return out;
}
