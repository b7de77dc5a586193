// The recorder's capture of a session, read back, and replayed once through fresh decoders to
// say whether it decodes to the frames that were recorded.
import { queryOptions, useQuery } from '@tanstack/react-query';
import { replayArchive, type Archive, type Direction } from '../../../../shared/link';
import { fetchBytes } from './fetch-bytes';
import { sessionKeys } from '../../../lib/resources/sessions';

export interface SessionCapture {
  archive: Archive;
  bytes: number;
  /** Directions whose decoded frames the recorder kept (the Bench page keeps the device's). */
  checked: Direction[];
  /** Frames in the checked directions: as recorded, and as decoded again from the bytes. */
  recordedFrames: number;
  replayedFrames: number;
  replayedSkips: number;
}

export async function getSessionCapture(id: number, signal?: AbortSignal): Promise<SessionCapture> {
  const buf = new Uint8Array(await fetchBytes(`/api/sessions/${id}/archive`, signal));
  const replay = replayArchive(buf);
  const { archive } = replay;
  // A direction whose frames were not recorded has nothing to compare its bytes with.
  const recorded = archive.records.filter((r) => r.type === 'frame');
  const checked = (['to-host', 'to-device'] as const).filter((d) => recorded.some((r) => r.direction === d));
  return {
    archive,
    bytes: buf.length,
    checked,
    recordedFrames: recorded.length,
    replayedFrames: replay.frames.filter((f) => checked.includes(f.direction)).length,
    replayedSkips: replay.skips.filter((s) => checked.includes(s.direction)).length,
  };
}

export const sessionCaptureQueryOptions = (id: number) =>
  queryOptions({ queryKey: sessionKeys.capture(id), queryFn: ({ signal }) => getSessionCapture(id, signal), staleTime: Infinity, retry: false });

/** Idle until `enabled`: a capture is only read when someone opens it. */
export const useSessionCapture = (id: number, enabled: boolean) => useQuery({ ...sessionCaptureQueryOptions(id), enabled });
