import { useMutation } from '@tanstack/react-query';
import { reviewRequestReply } from '../../../../shared/contract/builds';
import { apiReply } from '../../../lib/api';

// Nothing cached to refresh: the server only mails the reviewers and records it in the audit log.

/** Ask every reviewer to look at a build; `reviewers` is how many were asked, `mailed` whether the mail went. */
export const requestReview = (buildId: number) => apiReply(reviewRequestReply, `/api/builds/${buildId}/request-review`, { method: 'POST' });

export const useRequestReview = (buildId: number) => useMutation({ mutationFn: () => requestReview(buildId) });
