import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { auditListReply } from '../../../../shared/contract/misc';
import { apiReply } from '../../../lib/api';
import { teamKeys } from './keys';

export type { AuditEntry } from '../../../../shared/contract/misc';

export const getAudit = (offset: number, limit: number, signal?: AbortSignal) =>
  apiReply(auditListReply, `/api/audit?offset=${offset}&limit=${limit}`, { signal });

export const auditQueryOptions = (offset: number, limit: number) =>
  queryOptions({ queryKey: teamKeys.audit(offset, limit), queryFn: ({ signal }) => getAudit(offset, limit, signal) });

export const useAudit = (offset: number, limit: number) => useQuery({ ...auditQueryOptions(offset, limit), placeholderData: keepPreviousData });
