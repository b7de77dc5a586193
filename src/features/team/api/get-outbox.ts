import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { outboxListReply } from '../../../../shared/contract/misc';
import { apiReply } from '../../../lib/api';
import { teamKeys } from './keys';

/** A message the local mail catcher received. */
export type { OutboxMessage } from '../../../../shared/contract/misc';

export const getOutbox = (offset: number, limit: number, signal?: AbortSignal) =>
  apiReply(outboxListReply, `/api/outbox?offset=${offset}&limit=${limit}`, { signal });

export const outboxQueryOptions = (offset: number, limit: number) =>
  queryOptions({ queryKey: teamKeys.outbox(offset, limit), queryFn: ({ signal }) => getOutbox(offset, limit, signal) });

export const useOutbox = (offset: number, limit: number) => useQuery({ ...outboxQueryOptions(offset, limit), placeholderData: keepPreviousData });
