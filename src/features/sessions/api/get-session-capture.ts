// The recorder's capture of a session, read back, and replayed once through fresh decoders to
// say whether it decodes to the frames that were recorded.
import { queryOptions, useQuery } from '@tanstack/react-query';
import { replayArchive, type Archive } from '../../../../shared/link';
import { fetchBytes } from './fetch-bytes';
import { sessionKeys } from './session-keys';

export interface SessionCapture {
  archive: Archive;
  bytes: number;
  recordedFrames: number;
  replayedFrames: number;
  replayedSkips: number;
}

export async function getSessionCapture(id: number, signal?: AbortSignal): Promise<SessionCapture> {
  const buf = new Uint8Array(await fetchBytes(`/api/sessions/${id}/archive`, signal));
  const replay = replayArchive(buf);
  const { archive } = replay;
  return {
    archive,
    bytes: buf.length,
    recordedFrames: archive.records.filter((r) => r.type === 'frame').length,
    replayedFrames: replay.frames.length,
    replayedSkips: replay.skips.length,
  };
}

export const sessionCaptureQueryOptions = (id: number) =>
  queryOptions({ queryKey: sessionKeys.capture(id), queryFn: ({ signal }) => getSessionCapture(id, signal), staleTime: Infinity, retry: false });

/** Idle until `enabled`: a capture is only read when someone opens it. */
export const useSessionCapture = (id: number, enabled: boolean) => useQuery({ ...sessionCaptureQueryOptions(id), enabled });
