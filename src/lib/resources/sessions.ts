// Bench sessions as every page reads them: one key factory, the list and detail queries and the
// shapes of their replies, all from the API contract (shared/contract/sessions.ts). The list
// pages, the boards and builds pages, the compare picker, the core's baseline and the Bench
// page's save all go through here, so a saved, edited or deleted session refreshes every view.
import { queryOptions, useQuery } from '@tanstack/react-query';
import {
  sessionDetailReply,
  sessionPage,
  sessionPatchReply,
  sessionStoredReply,
  type SessionListItem,
  type SessionPage,
  type SessionPatchBody,
  type SessionRow,
  type SessionStoredReply,
} from '../../../shared/contract/sessions';
import { apiReply } from '../api';

export type { Named } from '../../../shared/contract/common';
export type { LimitOutcome, Verdict } from '../../../shared/contract/sessions';
/** A session as the list and the detail show it (its columns and the names of its core, build, board, operator). */
export type SessionRecord = SessionListItem;
/** A session's own columns, as an edit answers. */
export type { SessionRow, SessionPage, SessionStoredReply };

/** GET /api/sessions's filters, order and page; left out, the server's default. */
export interface SessionListParams {
  coreId?: number;
  buildId?: number;
  boardId?: number;
  operatorId?: number;
  passed?: boolean;
  regression?: boolean;
  tag?: string;
  /** ISO 8601 instants, both inclusive. */
  from?: string;
  to?: string;
  /** Condition ranges, both bounds inclusive. */
  temperatureMin?: number;
  temperatureMax?: number;
  vccintMin?: number;
  vccintMax?: number;
  clockMin?: number;
  clockMax?: number;
  sort?: '-startedAt' | 'startedAt' | '-id' | 'id';
  page?: number;
  pageSize?: number;
}

const PARAM_ORDER = [
  'coreId', 'buildId', 'boardId', 'operatorId', 'passed', 'regression', 'tag', 'from', 'to',
  'temperatureMin', 'temperatureMax', 'vccintMin', 'vccintMax', 'clockMin', 'clockMax', 'sort', 'page', 'pageSize',
] as const;

/** The query string of a list request (without "?"), its parameters always in one order. */
export function sessionListSearch(params: SessionListParams): string {
  const p = new URLSearchParams();
  for (const key of PARAM_ORDER) if (params[key] !== undefined) p.set(key, String(params[key]));
  return p.toString();
}

/**
 * Every query about sessions lives under `sessionKeys.all`, so invalidating it reaches all of
 * them. Samples and captures never change once stored: they have roots of their own, so editing
 * a session's notes does not score its samples again.
 */
export const sessionKeys = {
  all: ['sessions'] as const,
  lists: () => [...sessionKeys.all, 'list'] as const,
  list: (params: SessionListParams) => [...sessionKeys.lists(), sessionListSearch(params)] as const,
  details: () => [...sessionKeys.all, 'detail'] as const,
  detail: (id: number) => [...sessionKeys.details(), id] as const,
  comments: (id: number) => [...sessionKeys.detail(id), 'comments'] as const,
  plots: (id: number) => ['session-plots', id] as const,
  capture: (id: number) => ['session-capture', id] as const,
};

export const getSessionPage = (params: SessionListParams, signal?: AbortSignal) => apiReply(sessionPage, `/api/sessions?${sessionListSearch(params)}`, { signal });

export const sessionListQueryOptions = (params: SessionListParams) =>
  queryOptions({ queryKey: sessionKeys.list(params), queryFn: ({ signal }) => getSessionPage(params, signal) });

export const getSession = async (id: number, signal?: AbortSignal) => (await apiReply(sessionDetailReply, `/api/sessions/${id}`, { signal })).session;

export const sessionDetailQueryOptions = (id: number) => queryOptions({ queryKey: sessionKeys.detail(id), queryFn: ({ signal }) => getSession(id, signal) });

/** One session; idle while `id` is null. */
export const useSession = (id: number | null) => useQuery({ ...sessionDetailQueryOptions(id ?? 0), enabled: id !== null });

/** PATCH /api/sessions/:id: notes, tags, or making it its core's baseline. */
export const patchSession = async (id: number, body: SessionPatchBody) =>
  (await apiReply(sessionPatchReply, `/api/sessions/${id}`, { method: 'PATCH', body })).session;

/** POST /api/sessions with a multipart body (see the Bench page's save). */
export const postSession = (form: FormData) => apiReply(sessionStoredReply, '/api/sessions', { method: 'POST', body: form });
