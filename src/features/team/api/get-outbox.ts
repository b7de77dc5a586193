import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { teamKeys } from './keys';

/** A message the local mail catcher received. */
export interface OutboxMessage {
  id: number;
  to: string;
  from: string;
  subject: string;
  text: string;
  html: string | null;
  receivedAt: string;
}

export const getOutbox = (offset: number, limit: number, signal?: AbortSignal) =>
  api<{ messages: OutboxMessage[]; total: number }>(`/api/outbox?offset=${offset}&limit=${limit}`, { signal });

export const outboxQueryOptions = (offset: number, limit: number) =>
  queryOptions({ queryKey: teamKeys.outbox(offset, limit), queryFn: ({ signal }) => getOutbox(offset, limit, signal) });

export const useOutbox = (offset: number, limit: number) => useQuery({ ...outboxQueryOptions(offset, limit), placeholderData: keepPreviousData });
