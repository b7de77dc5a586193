import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { btnPrimary, fieldError, input, label } from '../../../components/ui';
import { invitationInputSchema, useCreateInvitation, type InvitationInput } from '../api/create-invitation';
import { useInvitations } from '../api/get-invitations';
import { ROLES, type TeamUser } from '../api/get-users';

const when = (iso: string) => new Date(iso).toLocaleString('en-GB', { day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit' });

/** Invite by e-mail (the invitee still chooses their own account name and password from the mailed link); pending invitations below. */
export function InvitationsPanel({ users }: { users: TeamUser[] }) {
  const invitations = useInvitations();
  const create = useCreateInvitation();
  const { register, handleSubmit, reset, formState } = useForm<InvitationInput>({ resolver: zodResolver(invitationInputSchema), defaultValues: { email: '', name: '', role: 'engineer' } });
  const e = formState.errors;
  const submit = (v: InvitationInput) => create.mutate(v, { onSuccess: () => reset({ email: '', name: '', role: v.role }) });
  const now = Date.now();
  const pending = invitations.data?.filter((i) => i.usedAt === null && new Date(i.expiresAt).getTime() > now) ?? [];
  const nameOf = (id: number | null) => users.find((u) => u.id === id)?.name ?? '—';

  return (
    <div className="grid gap-4">
      <form noValidate onSubmit={handleSubmit(submit)} aria-label="Invite someone" className="grid gap-3 sm:grid-cols-[2fr_2fr_1fr_auto] sm:items-start">
        <label className={`${label} content-start`}>
          <span className="font-bold">E-mail</span>
          <input type="email" className={input} autoComplete="off" aria-invalid={e.email ? true : undefined} {...register('email')} />
          {e.email && <span className={fieldError}>{e.email.message}</span>}
        </label>
        <label className={label}>
          <span className="font-bold">Name <span className="font-normal text-ink-soft">(optional)</span></span>
          <input className={input} autoComplete="off" aria-invalid={e.name ? true : undefined} {...register('name')} />
          {e.name && <span className={fieldError}>{e.name.message}</span>}
        </label>
        <label className={label}>
          <span className="font-bold">Role</span>
          <select className={input} {...register('role')}>
            {ROLES.map((r) => (
              <option key={r}>{r}</option>
            ))}
          </select>
        </label>
        <button type="submit" className={`${btnPrimary} sm:mt-6`} disabled={create.isPending}>
          {create.isPending ? 'Sending…' : 'Send invitation'}
        </button>
        <div className="sm:col-span-4" role="status">
          {create.isSuccess && (
            <p className="text-sm">
              Invitation for {create.data.invitation.email} stored{create.data.mailed ? ' and mailed; it is in the outbox below.' : ', but the mail could not be sent. Check the mail settings.'}
            </p>
          )}
        </div>
        {create.isError && <p role="alert" className={`${fieldError} sm:col-span-4`}>The invitation was refused: {create.error.message.replace(/^body\.email: /, '')}</p>}
      </form>

      <div>
        <h3 className="mb-2 text-sm font-bold">Pending invitations</h3>
        {invitations.isPending && <p className="text-sm text-ink-soft">Loading…</p>}
        {invitations.isError && <p role="alert" className={fieldError}>The invitations could not be loaded: {invitations.error.message}</p>}
        {invitations.data && pending.length === 0 && <p className="text-sm text-ink-soft">None pending.</p>}
        {pending.length > 0 && (
          <table className="w-full text-sm" aria-label="Pending invitations">
            <thead className="border-b border-rule text-left text-xs uppercase tracking-wider text-ink-soft">
              <tr>
                <th scope="col" className="px-3 py-2">E-mail</th>
                <th scope="col" className="px-3 py-2">Name</th>
                <th scope="col" className="px-3 py-2">Role</th>
                <th scope="col" className="px-3 py-2">Invited by</th>
                <th scope="col" className="px-3 py-2">Expires</th>
              </tr>
            </thead>
            <tbody>
              {pending.map((i) => (
                <tr key={i.id} className="border-b border-rule/60 last:border-0">
                  <td className="px-3 py-2 font-mono text-xs">{i.email}</td>
                  <td className="px-3 py-2">{i.name ?? '—'}</td>
                  <td className="px-3 py-2">{i.role}</td>
                  <td className="px-3 py-2">{nameOf(i.invitedById)}</td>
                  <td className="px-3 py-2">{when(i.expiresAt)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </div>
    </div>
  );
}
