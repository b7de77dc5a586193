import { queryOptions, useQuery } from '@tanstack/react-query';
import { invitationListReply } from '../../../../shared/contract/people';
import { apiReply } from '../../../lib/api';
import { teamKeys } from './keys';

/** `name`: who it is for, as the admin wrote it; the invitee chooses their own account name. */
export type { Invitation } from '../../../../shared/contract/people';

export const getInvitations = async (signal?: AbortSignal) => (await apiReply(invitationListReply, '/api/invitations', { signal })).invitations;

export const invitationsQueryOptions = () => queryOptions({ queryKey: teamKeys.invitations(), queryFn: ({ signal }) => getInvitations(signal) });

export const useInvitations = () => useQuery(invitationsQueryOptions());
