import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { tokenCreatedReply, tokenListReply } from '../../../../shared/contract/people';
import { api, apiReply } from '../../../lib/api';

/** A token as the API shows it: `prefix` is the first characters of the secret, to tell tokens apart. */
export type { ApiToken as ApiTokenRecord } from '../../../../shared/contract/people';

const tokenKeys = { all: ['api-tokens'] as const };

export const apiTokensQueryOptions = () =>
  queryOptions({ queryKey: tokenKeys.all, queryFn: async ({ signal }) => (await apiReply(tokenListReply, '/api/tokens', { signal })).tokens });

export const useApiTokens = () => useQuery(apiTokensQueryOptions());

/** Create a token; the reply holds its secret, which the server never shows again. */
export function useCreateApiToken() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (name: string) => apiReply(tokenCreatedReply, '/api/tokens', { method: 'POST', body: { name } }),
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
