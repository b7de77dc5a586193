// Vectoring answers rebuilt from a recorder archive: the VEC_ONE, VEC_LIST and VEC_GRID requests
// the host sent, paired by TAG with the VEC_RESULTS the board returned, as archive-samples.ts does
// for rotating requests. VEC_* frames are read at the formats the capture's VECTOR_FORMATS records
// give (archive version 2; docs/archive.md), or the default vectoring core's before any.
import { decodePayload, gridVector, Kind, PayloadError, profileFromInfo, replayArchive, vectorWireProfile, type VectoringFormats, type WireProfile } from '../link';

export interface VectorArchiveSamples {
  /** Answered vectors in request order, first answer of each request slot. */
  xs: Int32Array;
  ys: Int32Array;
  angle: Int32Array;
  magnitude: Int32Array;
  label: string;
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
  let formats: VectoringFormats | null = null;
  const requests: PendingRequest[] = [];
  const byTag = new Map<number, PendingRequest>();
  for (const { direction, frame } of frames) {
    let m;
    try {
      m = decodePayload(frame.kind, frame.payload, profile);
    } catch (err) {
      if (err instanceof PayloadError) continue; // the engine refused it on the bench as well
      throw err;
    }
    if (direction === 'to-device') {
      let request: Pick<PendingRequest, 'vector' | 'count'> | null = null;
      if (m.kind === Kind.VecOne) request = { vector: () => ({ x: m.x, y: m.y }), count: 1 };
      else if (m.kind === Kind.VecList) request = { vector: (i) => ({ x: m.xs[i], y: m.ys[i] }), count: m.xs.length };
      else if (m.kind === Kind.VecGrid) {
        const p = profile;
        request = { vector: (i) => gridVector(m, i, p), count: m.nx * m.ny };
      }
      if (!request) continue;
      const r = { ...request, angle: new Int32Array(request.count), magnitude: new Int32Array(request.count), got: new Uint8Array(request.count) };
      requests.push(r);
      byTag.set(frame.tag, r);
    } else if (m.kind === Kind.Info) {
      profile = { ...profileFromInfo(m.info), ...(profile.vector ? { vector: profile.vector } : {}) };
    } else if (m.kind === Kind.ModeInfo && m.modes.vectoring) {
      formats = m.modes.vectoring;
      profile = { ...profile, vector: vectorWireProfile(formats) };
    } else if (m.kind === Kind.VecResults) {
      const r = byTag.get(frame.tag);
      if (!r) continue;
      for (let k = 0; k < m.angle.length; k++) {
        const i = m.firstIndex + k;
        if (i >= r.count || r.got[i]) continue;
        r.angle[i] = m.angle[k];
        r.magnitude[i] = m.magnitude[k];
        r.got[i] = 1;
      }
    }
  }
  const out = { xs: [] as number[], ys: [] as number[], angle: [] as number[], magnitude: [] as number[] };
  for (const r of requests) {
    for (let i = 0; i < r.count; i++) {
      if (!r.got[i]) continue;
      const v = r.vector(i);
      out.xs.push(v.x);
      out.ys.push(v.y);
      out.angle.push(r.angle[i]);
      out.magnitude.push(r.magnitude[i]);
    }
  }
  return {
    xs: Int32Array.from(out.xs),
    ys: Int32Array.from(out.ys),
    angle: Int32Array.from(out.angle),
    magnitude: Int32Array.from(out.magnitude),
    label: archive.header.label,
    formats,
    checkFailures,
  };
}
