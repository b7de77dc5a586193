import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api';

export interface ApiTokenRecord {
  id: number;
  name: string;
  /** The first characters of the secret, to tell tokens apart. */
  prefix: string;
  lastUsedAt: string | null;
  createdAt: string;
}

const tokenKeys = { all: ['api-tokens'] as const };

export const apiTokensQueryOptions = () =>
  queryOptions({ queryKey: tokenKeys.all, queryFn: async ({ signal }) => (await api<{ tokens: ApiTokenRecord[] }>('/api/tokens', { signal })).tokens });

export const useApiTokens = () => useQuery(apiTokensQueryOptions());

/** Create a token; the reply holds its secret, which the server never shows again. */
export function useCreateApiToken() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (name: string) => api<ApiTokenRecord & { token: string }>('/api/tokens', { method: 'POST', body: { name } }),
    onSuccess: () => qc.invalidateQueries({ queryKey: tokenKeys.all }),
  });
}

export function useRevokeApiToken() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => api<void>(`/api/tokens/${id}`, { method: 'DELETE' }),
    onSuccess: () => qc.invalidateQueries({ queryKey: tokenKeys.all }),
  });
}
