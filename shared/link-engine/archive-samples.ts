// Results rebuilt from a recorder archive: the requests the host sent (ONE, LIST, SWEEP) paired by
// TAG with the RESULTS the board returned. A request answered twice (a retry whose first answer
// arrived late) keeps its first answer; samples come out in request order.
import {
  decodePayload,
  Kind,
  PayloadError,
  profileFromInfo,
  replayArchive,
  sweepAngleCode,
  type DeviceInfo,
  type WireProfile,
} from '../link';
import type { UnpackedSamples } from './sample-pack';

export interface ArchiveSamples extends UnpackedSamples {
  /** The device's INFO, when the capture holds one. */
  info: DeviceInfo | null;
  label: string;
  /** Requests the capture holds only part of the answers to (a later request may cover the rest). */
  incompleteRequests: number;
  /** Board-to-host frames refused for a bad CHECK: the link errors of the capture. */
  checkFailures: number;
  /** The wire profile at the end of the capture (after INFO). */
  profile: WireProfile;
}

interface PendingRequest {
  codes: (i: number) => number;
  count: number;
  cos: Int32Array;
  sin: Int32Array;
  got: Uint8Array;
}

/** @throws ArchiveError for a file that is not a readable archive. */
export function samplesFromArchive(bytes: Uint8Array): ArchiveSamples {
  const { archive, frames, skips } = replayArchive(bytes);
  const checkFailures = skips.filter((s) => s.direction === 'to-host' && s.event.reason === 'bad-check').length;
  let profile: WireProfile = archive.header.profile;
  let info: DeviceInfo | null = null;
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
      let codes: ((i: number) => number) | null = null;
      let count = 0;
      if (m.kind === Kind.One) [codes, count] = [() => m.angleCode, 1];
      else if (m.kind === Kind.List) [codes, count] = [(i) => m.angleCodes[i], m.angleCodes.length];
      else if (m.kind === Kind.Sweep) {
        const p = profile;
        [codes, count] = [(i) => sweepAngleCode(m.start, m.step, i, p), m.count];
      }
      if (!codes) continue;
      const previous = byTag.get(frame.tag);
      const retry = previous && previous.count === count && previous.codes(0) === codes(0) && previous.got.includes(0);
      if (retry) continue;
      const request = { codes, count, cos: new Int32Array(count), sin: new Int32Array(count), got: new Uint8Array(count) };
      requests.push(request);
      byTag.set(frame.tag, request);
    } else if (m.kind === Kind.Info) {
      info = m.info;
      profile = profileFromInfo(m.info);
    } else if (m.kind === Kind.Results) {
      const request = byTag.get(frame.tag);
      if (!request) continue;
      for (let k = 0; k < m.cos.length; k++) {
        const i = m.firstIndex + k;
        if (i >= request.count || request.got[i]) continue;
        request.cos[i] = m.cos[k];
        request.sin[i] = m.sin[k];
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
  const out: ArchiveSamples = { codes: new Float64Array(total), cos: new Int32Array(total), sin: new Int32Array(total), info, label: archive.header.label, incompleteRequests, checkFailures, profile };
  let at = 0;
  for (const r of requests) {
    for (let i = 0; i < r.count; i++) {
      if (!r.got[i]) continue;
      out.codes[at] = r.codes(i);
      out.cos[at] = r.cos[i];
      out.sin[at] = r.sin[i];
      at++;
    }
  }
  return out;
}
