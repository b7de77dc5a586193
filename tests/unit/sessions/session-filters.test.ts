import { describe, expect, it } from 'vitest';
import { activeFilterCount, DEFAULT_FILTERS, filtersFromSearch, filtersToApiQuery, filtersToSearch, withFilters } from '../../../src/features/sessions/list/session-filters';

const parse = (q: string) => filtersFromSearch(new URLSearchParams(q));

describe('Sessions list filters in the address bar', () => {
  it('reads every filter from its search param', () => {
    expect(parse('core=2&build=5&board=3&operator=7&verdict=fail&regression=yes&tag=e2e&from=2026-03-01&to=2026-03-31&temperatureMin=-40&vccintMax=0.95&sort=id&page=3&size=50')).toEqual({
      coreId: 2,
      buildId: 5,
      boardId: 3,
      operatorId: 7,
      verdict: 'fail',
      regression: true,
      tag: 'e2e',
      from: '2026-03-01',
      to: '2026-03-31',
      temperatureMin: -40,
      temperatureMax: null,
      vccintMin: null,
      vccintMax: 0.95,
      clockMin: null,
      clockMax: null,
      sort: 'id',
      page: 3,
      pageSize: 50,
    });
  });

  it('passes condition ranges to the API under the same names and drops ones that are not numbers', () => {
    const f = parse('temperatureMin=85&temperatureMax=85&clockMin=abc');
    expect(f.clockMin).toBeNull();
    const q = new URLSearchParams(filtersToApiQuery(f));
    expect([q.get('temperatureMin'), q.get('temperatureMax'), q.get('clockMin')]).toEqual(['85', '85', null]);
    expect(activeFilterCount(f)).toBe(2);
  });

  it('drops values it cannot use instead of failing', () => {
    expect(parse('core=abc&build=-1&board=0&verdict=maybe&regression=1&from=2026-02-30&to=yesterday&sort=name&page=0&size=33&tag=%20%20')).toEqual(DEFAULT_FILTERS);
  });

  it('writes nothing for the defaults, so the plain list has a plain address', () => {
    expect(filtersToSearch(DEFAULT_FILTERS).toString()).toBe('');
  });

  it('round-trips a filtered list through the address bar', () => {
    const f = { ...DEFAULT_FILTERS, coreId: 1, verdict: 'pass' as const, regression: false, tag: 'exhaustive', sort: 'startedAt' as const, page: 2, pageSize: 100 };
    const search = filtersToSearch(f);
    expect(search.toString()).toBe('core=1&verdict=pass&regression=no&tag=exhaustive&sort=startedAt&page=2&size=100');
    expect(filtersFromSearch(search)).toEqual(f);
  });

  it('asks the server with its own parameter names, passed=false for failing sessions', () => {
    const q = new URLSearchParams(filtersToApiQuery({ ...DEFAULT_FILTERS, verdict: 'fail', regression: true, operatorId: 4, tag: 'a b' }));
    expect(Object.fromEntries(q)).toEqual({ operatorId: '4', passed: 'false', regression: 'true', tag: 'a b', sort: '-startedAt', page: '1', pageSize: '25' });
  });

  it('sends whole local days for the date range, both ends included', () => {
    const q = new URLSearchParams(filtersToApiQuery({ ...DEFAULT_FILTERS, from: '2026-03-01', to: '2026-03-02' }));
    expect(q.get('from')).toBe(new Date(2026, 2, 1).toISOString());
    expect(q.get('to')).toBe(new Date(new Date(2026, 2, 3).getTime() - 1).toISOString());
  });

  it('goes back to page 1 when a filter changes, but not when the page does', () => {
    const f = { ...DEFAULT_FILTERS, page: 4 };
    expect(withFilters(f, { verdict: 'fail' }).page).toBe(1);
    expect(withFilters(f, { page: 5 }).page).toBe(5);
  });

  it('counts the filters that narrow the list, not sort or page', () => {
    expect(activeFilterCount({ ...DEFAULT_FILTERS, sort: 'id', page: 3 })).toBe(0);
    expect(activeFilterCount({ ...DEFAULT_FILTERS, verdict: 'pass', regression: false, from: '2026-01-01' })).toBe(3);
  });
});
