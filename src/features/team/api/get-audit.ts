import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { teamKeys } from './keys';

export interface AuditEntry {
  id: number;
  userId: number | null;
  action: string;
  entity: string;
  entityId: number | null;
  detail: Record<string, unknown> | null;
  at: string;
}

export const getAudit = (offset: number, limit: number, signal?: AbortSignal) =>
  api<{ entries: AuditEntry[]; total: number }>(`/api/audit?offset=${offset}&limit=${limit}`, { signal });

export const auditQueryOptions = (offset: number, limit: number) =>
  queryOptions({ queryKey: teamKeys.audit(offset, limit), queryFn: ({ signal }) => getAudit(offset, limit, signal) });

export const useAudit = (offset: number, limit: number) => useQuery({ ...auditQueryOptions(offset, limit), placeholderData: keepPreviousData });
