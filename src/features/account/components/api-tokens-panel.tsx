import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { btn, btnPrimary, fieldError, input, label, panel, panelTitle } from '../../../components/ui';
import { useApiTokens, useCreateApiToken, useRevokeApiToken } from '../api/api-tokens';

const nameSchema = z.object({ name: z.string().trim().min(1, 'Name the token after where it runs, e.g. "CI runner, lab 3"').max(80) });
const when = (iso: string | null) => (iso ? new Date(iso).toLocaleString() : 'never');

/** The signed-in engineer's tokens for the command-line runner; a new secret is shown once. */
export function ApiTokensPanel() {
  const tokens = useApiTokens();
  const create = useCreateApiToken();
  const revoke = useRevokeApiToken();
  const [secret, setSecret] = useState<{ name: string; token: string } | null>(null);
  const [copied, setCopied] = useState(false);
  const form = useForm<{ name: string }>({ resolver: zodResolver(nameSchema), defaultValues: { name: '' } });

  const submit = form.handleSubmit(({ name }) =>
    create.mutate(name, {
      onSuccess: (t) => {
        setSecret({ name: t.name, token: t.token });
        setCopied(false);
        form.reset();
      },
    }),
  );
  const copy = async () => {
    if (!secret) return;
    try {
      await navigator.clipboard.writeText(secret.token);
      setCopied(true);
    } catch {
      setCopied(false); // the text stays selectable in the box
    }
  };

  return (
    <section aria-labelledby="tokens-title" className={panel}>
      <h2 id="tokens-title" className={panelTitle}>
        API tokens for the runner
      </h2>
      <p className="mb-3 max-w-2xl text-sm text-ink-soft">
        The command-line runner uploads sessions as you with <code className="font-mono">--token</code>. A token is shown
        once, when it is made; revoke it when the machine that holds it is retired.
      </p>
      <form noValidate onSubmit={submit} className="mb-4 flex flex-wrap items-end gap-2">
        <label className={`${label} min-w-64 flex-1`}>
          <span>Token name</span>
          <input className={input} aria-invalid={!!form.formState.errors.name} {...form.register('name')} />
          {form.formState.errors.name && <span className={fieldError}>{form.formState.errors.name.message}</span>}
        </label>
        <button type="submit" className={btnPrimary} disabled={create.isPending}>
          {create.isPending ? 'Making…' : 'Make token'}
        </button>
      </form>
      {create.isError && <p role="alert" className={`${fieldError} mb-3`}>The token could not be made: {create.error.message}</p>}
      {secret && (
        <div role="status" className="mb-4 grid gap-2 rounded border border-signal bg-signal-soft p-3 text-sm">
          <p className="font-bold">Token “{secret.name}”: copy it now, it will not be shown again.</p>
          <input readOnly aria-label="New token" value={secret.token} className={`${input} font-mono`} onFocus={(e) => e.currentTarget.select()} data-testid="new-token" />
          <div className="flex gap-2">
            <button type="button" className={btn} onClick={copy}>
              {copied ? 'Copied' : 'Copy'}
            </button>
            <button type="button" className={btn} onClick={() => setSecret(null)}>
              Done
            </button>
          </div>
        </div>
      )}
      {tokens.isPending && <p className="text-sm text-ink-soft">Loading tokens…</p>}
      {tokens.isError && <p role="alert" className={fieldError}>Tokens could not be loaded: {tokens.error.message}</p>}
      {tokens.data && tokens.data.length === 0 && <p className="text-sm text-ink-soft">No tokens yet.</p>}
      {tokens.data && tokens.data.length > 0 && (
        <table className="w-full text-sm">
          <thead className="text-left text-ink-soft">
            <tr>
              <th className="py-1 pr-3 font-normal">name</th>
              <th className="py-1 pr-3 font-normal">starts with</th>
              <th className="py-1 pr-3 font-normal">made</th>
              <th className="py-1 pr-3 font-normal">last used</th>
              <th className="py-1 font-normal">
                <span className="sr-only">actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {tokens.data.map((t) => (
              <tr key={t.id} className="border-t border-rule">
                <td className="py-1.5 pr-3 font-bold">{t.name}</td>
                <td className="py-1.5 pr-3 font-mono">{t.prefix}…</td>
                <td className="py-1.5 pr-3">{when(t.createdAt)}</td>
                <td className="py-1.5 pr-3">{when(t.lastUsedAt)}</td>
                <td className="py-1.5 text-right">
                  <button
                    type="button"
                    className={btn}
                    disabled={revoke.isPending}
                    onClick={() => window.confirm(`Revoke “${t.name}”? The runner holding it will be refused from now on.`) && revoke.mutate(t.id)}
                  >
                    Revoke
                  </button>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {revoke.isError && <p role="alert" className={`${fieldError} mt-2`}>The token could not be revoked: {revoke.error.message}</p>}
    </section>
  );
}
