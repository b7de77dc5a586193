// GET /api/stations: the stations online, who drives each and since when (docs/api.md).
import { z } from 'zod';
import { isoDate } from './common';

/** One station as the list shows it: its registration, who registered it, who drives it now. */
export const stationListing = z.object({
  name: z.string(),
  device: z.string(),
  baud: z.number().int(),
  /** Who registered it (whose API token it used). */
  owner: z.string(),
  onlineSince: isoDate,
  /** Who is driving it now and since when, or null when it is free. */
  inUse: z.object({ by: z.string(), since: isoDate }).nullable(),
});
export type StationListing = z.infer<typeof stationListing>;

/** GET /api/stations */
export const stationListReply = z.object({ stations: z.array(stationListing) });
