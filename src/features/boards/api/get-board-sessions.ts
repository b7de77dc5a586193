import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';

/** The fields of a session list item this page shows (GET /api/sessions). */
export interface BoardSession {
  id: number;
  coreId: number;
  startedAt: string;
  sampleCount: number;
  passed: boolean;
  regression: boolean;
  core?: { id: number; name: string; slug: string };
  build?: { id: number; label: string } | null;
  operator?: { id: number; name: string } | null;
}

export interface SessionPage {
  items: BoardSession[];
  total: number;
  page: number;
  pageSize: number;
}

export const PAGE_SIZE = 20;

export const getBoardSessions = (boardId: number, page: number, signal?: AbortSignal) =>
  api<SessionPage>(`/api/sessions?boardId=${boardId}&page=${page}&pageSize=${PAGE_SIZE}&sort=-startedAt`, { signal });

// Under the sessions root, so a saved or deleted session refreshes this list too.
export const boardSessionsQueryOptions = (boardId: number, page: number) =>
  queryOptions({ queryKey: ['sessions', 'by-board', boardId, page] as const, queryFn: ({ signal }) => getBoardSessions(boardId, page, signal) });

export const useBoardSessions = (boardId: number, page: number) => useQuery({ ...boardSessionsQueryOptions(boardId, page), placeholderData: keepPreviousData });
