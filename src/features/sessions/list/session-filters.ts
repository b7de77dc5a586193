// The Sessions list's filters, sort and page, kept in the address bar so a filtered list can be
// shared and reloaded. Parsing is forgiving (a bad value is dropped, not an error page); the API
// query is built from the parsed form only.
import { sessionListSearch, type SessionListParams } from '../../../lib/resources/sessions';

export const SORTS = ['-startedAt', 'startedAt', '-id', 'id'] as const;
export type SortKey = (typeof SORTS)[number];
export const PAGE_SIZES = [25, 50, 100] as const;

export interface SessionFilters {
  coreId: number | null;
  buildId: number | null;
  boardId: number | null;
  operatorId: number | null;
  verdict: 'pass' | 'fail' | null;
  regression: boolean | null;
  /** Exact tag match. */
  tag: string | null;
  /** Local calendar days, YYYY-MM-DD, both inclusive. */
  from: string | null;
  to: string | null;
  /** Condition ranges, both bounds inclusive (the address bar and the API use the same names). */
  temperatureMin: number | null;
  temperatureMax: number | null;
  vccintMin: number | null;
  vccintMax: number | null;
  clockMin: number | null;
  clockMax: number | null;
  sort: SortKey;
  page: number;
  pageSize: number;
}

export const DEFAULT_FILTERS: SessionFilters = {
  coreId: null,
  buildId: null,
  boardId: null,
  operatorId: null,
  verdict: null,
  regression: null,
  tag: null,
  from: null,
  to: null,
  temperatureMin: null,
  temperatureMax: null,
  vccintMin: null,
  vccintMax: null,
  clockMin: null,
  clockMax: null,
  sort: '-startedAt',
  page: 1,
  pageSize: 25,
};

const DAY = /^\d{4}-\d{2}-\d{2}$/;

const positiveInt = (v: string | null): number | null => {
  if (v === null || !/^\d+$/.test(v)) return null;
  const n = Number(v);
  return n >= 1 && Number.isSafeInteger(n) ? n : null;
};

export const CONDITION_FILTER_KEYS = ['temperatureMin', 'temperatureMax', 'vccintMin', 'vccintMax', 'clockMin', 'clockMax'] as const;

const decimal = (v: string | null): number | null => (v !== null && /^-?\d+(\.\d+)?$/.test(v.trim()) ? Number(v) : null);

const day = (v: string | null): string | null => (v !== null && DAY.test(v) && !Number.isNaN(localDay(v, 0).getTime()) ? v : null);

/** Midnight of a YYYY-MM-DD day in local time, `plusDays` later. */
function localDay(v: string, plusDays: number): Date {
  const [y, m, d] = v.split('-').map(Number);
  const date = new Date(y, m - 1, d + plusDays);
  // Reject days the calendar does not have (2026-02-30 would roll over to March).
  return plusDays === 0 && (date.getMonth() !== m - 1 || date.getDate() !== d) ? new Date(NaN) : date;
}

/** Filters from the address bar's search params. */
export function filtersFromSearch(params: URLSearchParams): SessionFilters {
  const verdict = params.get('verdict');
  const regression = params.get('regression');
  const sort = params.get('sort') as SortKey | null;
  const size = positiveInt(params.get('size'));
  const tag = params.get('tag')?.trim();
  return {
    coreId: positiveInt(params.get('core')),
    buildId: positiveInt(params.get('build')),
    boardId: positiveInt(params.get('board')),
    operatorId: positiveInt(params.get('operator')),
    verdict: verdict === 'pass' || verdict === 'fail' ? verdict : null,
    regression: regression === 'yes' ? true : regression === 'no' ? false : null,
    tag: tag ? tag.slice(0, 40) : null,
    from: day(params.get('from')),
    to: day(params.get('to')),
    ...(Object.fromEntries(CONDITION_FILTER_KEYS.map((k) => [k, decimal(params.get(k))])) as Record<(typeof CONDITION_FILTER_KEYS)[number], number | null>),
    sort: sort && SORTS.includes(sort) ? sort : DEFAULT_FILTERS.sort,
    page: positiveInt(params.get('page')) ?? 1,
    pageSize: size && (PAGE_SIZES as readonly number[]).includes(size) ? size : DEFAULT_FILTERS.pageSize,
  };
}

/** Search params for the address bar; defaults are left out so plain /sessions stays plain. */
export function filtersToSearch(f: SessionFilters): URLSearchParams {
  const p = new URLSearchParams();
  const put = (k: string, v: string | number | null, dflt: string | number | null = null) => {
    if (v !== null && v !== dflt) p.set(k, String(v));
  };
  put('core', f.coreId);
  put('build', f.buildId);
  put('board', f.boardId);
  put('operator', f.operatorId);
  put('verdict', f.verdict);
  put('regression', f.regression === null ? null : f.regression ? 'yes' : 'no');
  put('tag', f.tag);
  put('from', f.from);
  put('to', f.to);
  for (const k of CONDITION_FILTER_KEYS) put(k, f[k]);
  put('sort', f.sort, DEFAULT_FILTERS.sort);
  put('page', f.page, 1);
  put('size', f.pageSize, DEFAULT_FILTERS.pageSize);
  return p;
}

/** The GET /api/sessions parameters for these filters. */
export function filtersToListParams(f: SessionFilters): SessionListParams {
  const p: SessionListParams = {};
  if (f.coreId !== null) p.coreId = f.coreId;
  if (f.buildId !== null) p.buildId = f.buildId;
  if (f.boardId !== null) p.boardId = f.boardId;
  if (f.operatorId !== null) p.operatorId = f.operatorId;
  if (f.verdict !== null) p.passed = f.verdict === 'pass';
  if (f.regression !== null) p.regression = f.regression;
  if (f.tag !== null) p.tag = f.tag;
  // Whole local days: from its midnight up to (not including) the midnight after `to`.
  if (f.from !== null) p.from = localDay(f.from, 0).toISOString();
  if (f.to !== null) p.to = new Date(localDay(f.to, 1).getTime() - 1).toISOString();
  for (const k of CONDITION_FILTER_KEYS) if (f[k] !== null) p[k] = f[k];
  return { ...p, sort: f.sort, page: f.page, pageSize: f.pageSize };
}

/** The GET /api/sessions query string for these filters (without the leading "?"). */
export const filtersToApiQuery = (f: SessionFilters): string => sessionListSearch(filtersToListParams(f));

/** Change some filters; any change but the page itself goes back to page 1. */
export function withFilters(f: SessionFilters, patch: Partial<SessionFilters>): SessionFilters {
  return { ...f, ...patch, page: patch.page ?? 1 };
}

/** How many filters narrow the list (sort and page aside). */
export function activeFilterCount(f: SessionFilters): number {
  return (['coreId', 'buildId', 'boardId', 'operatorId', 'verdict', 'regression', 'tag', 'from', 'to', ...CONDITION_FILTER_KEYS] as const).filter((k) => f[k] !== null).length;
}
