import type { QueryClient } from '@tanstack/react-query';
import { redirect, type LoaderFunctionArgs } from 'react-router-dom';
import { meQueryOptions } from '../features/auth/api/get-me';

/** A loader for pages that need sign-in: off to /sign-in (and back afterwards) when nobody is. */
export const requireUser =
  (qc: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    const user = await qc.ensureQueryData(meQueryOptions());
    if (!user) {
      const url = new URL(request.url);
      throw redirect(`/sign-in?next=${encodeURIComponent(url.pathname + url.search)}`);
    }
    return user;
  };
