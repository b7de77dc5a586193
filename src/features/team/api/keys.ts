// One key factory for the admin's team data: users, invitations, the audit log and the outbox.
export const teamKeys = {
  all: ['team'] as const,
  users: () => [...teamKeys.all, 'users'] as const,
  invitations: () => [...teamKeys.all, 'invitations'] as const,
  audit: (offset: number, limit: number) => [...teamKeys.all, 'audit', { offset, limit }] as const,
  outbox: (offset: number, limit: number) => [...teamKeys.all, 'outbox', { offset, limit }] as const,
};
