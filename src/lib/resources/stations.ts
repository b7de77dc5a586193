// The stations online (GET /api/stations), read by the Bench page's picker and the Boards page's
// panel. Stations come and go and change hands, so the list is asked for again every few seconds.
import { queryOptions, useQuery } from '@tanstack/react-query';
import { stationListReply, type StationListing } from '../../../shared/contract/stations';
import { apiReply } from '../api';

export type { StationListing };

/** How often an open page asks again: a station taken or freed shows within this. */
export const STATIONS_REFRESH_MS = 3_000;

export const stationKeys = {
  all: ['stations'] as const,
  list: () => [...stationKeys.all, 'list'] as const,
};

export const getStations = async (signal?: AbortSignal) => (await apiReply(stationListReply, '/api/stations', { signal })).stations;

export const stationsQueryOptions = () =>
  queryOptions({ queryKey: stationKeys.list(), queryFn: ({ signal }) => getStations(signal), staleTime: 0, refetchInterval: STATIONS_REFRESH_MS });

export const useStations = () => useQuery(stationsQueryOptions());

/** "since 09:12:03" today, or with the date when it was another day. */
export function sinceText(iso: string, now = new Date()): string {
  const d = new Date(iso);
  const time = d.toLocaleTimeString(undefined, { hour: '2-digit', minute: '2-digit', second: '2-digit' });
  return d.toDateString() === now.toDateString() ? `since ${time}` : `since ${d.toLocaleDateString()} ${time}`;
}
