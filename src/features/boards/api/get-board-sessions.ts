import { keepPreviousData, useQuery } from '@tanstack/react-query';
import { sessionListQueryOptions } from '../../../lib/resources/sessions';

export const PAGE_SIZE = 20;

/** Sessions run on one board, newest first, a page at a time. */
export const boardSessionsQueryOptions = (boardId: number, page: number) => sessionListQueryOptions({ boardId, sort: '-startedAt', page, pageSize: PAGE_SIZE });

export const useBoardSessions = (boardId: number, page: number) => useQuery({ ...boardSessionsQueryOptions(boardId, page), placeholderData: keepPreviousData });
