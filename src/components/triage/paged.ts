// Triage and the caseload a page at a time: the server searches, filters and
// orders the whole list (a regional service holds a thousand clients) and
// sends 50 rows; "Show more" appends the next 50.
import type { SortingState } from '@tanstack/react-table';
import { useCallback, useEffect, useRef, useState } from 'react';
import { api, type ApiError, type Loadable } from '../api';
import type { RowFilter } from './filter';
import type { ClientRow, ListPage } from './types';

export const PAGE_SIZE = 50;
// The server's largest page: a reload after an action keeps up to this many rows in view.
const MAX_PAGE = 200;
// Typing a name asks the server once the typing pauses.
const SEARCH_PAUSE_MS = 300;

export interface PagedRows {
  state: 'loading' | 'error' | 'ready';
  error: ApiError | null;
  rows: ClientRow[];
  page: ListPage | null;
  /** Asking for the next page. */
  loadingMore: boolean;
  loadMore: () => void;
  /** Reads the rows in view again (after acting on a flag). */
  reload: () => void;
}

/** The query string of one page of `base` (/api/triage or /api/caseload). */
export function pageUrl(base: string, filter: RowFilter, sorting: SortingState, offset: number, limit = PAGE_SIZE): string {
  const q = new URLSearchParams({ limit: String(limit), offset: String(offset) });
  if (filter.search.trim()) q.set('q', filter.search.trim());
  if (filter.kind) q.set('kind', filter.kind);
  if (filter.severity) q.set('severity', filter.severity);
  const sort = sorting[0];
  if (sort) {
    q.set('sort', sort.id);
    if (sort.desc) q.set('desc', '1');
  }
  return `${base}?${q}`;
}

type Value = Omit<PagedRows, 'loadMore' | 'reload'>;

export function usePagedRows(base: string, filter: RowFilter, sorting: SortingState): PagedRows {
  const [search, setSearch] = useState(filter.search);
  useEffect(() => {
    const t = setTimeout(() => setSearch(filter.search), SEARCH_PAUSE_MS);
    return () => clearTimeout(t);
  }, [filter.search]);
  const query = { ...filter, search };
  const key = pageUrl(base, query, sorting, 0);
  const [tick, setTick] = useState(0);
  const [value, setValue] = useState<Value>({ state: 'loading', error: null, rows: [], page: null, loadingMore: false });
  const latest = useRef(value);
  latest.current = value;
  // Answers to an older query (typing on, a new order) are dropped.
  const asked = useRef(key);
  asked.current = key;
  const kept = useRef(PAGE_SIZE);

  useEffect(() => {
    let live = true;
    const limit = kept.current;
    kept.current = PAGE_SIZE;
    setValue((v) => ({ ...v, state: v.state === 'ready' ? 'ready' : 'loading' }));
    api<ListPage>('GET', pageUrl(base, query, sorting, 0, limit)).then(
      (page) => live && setValue({ state: 'ready', error: null, rows: page.clients, page, loadingMore: false }),
      (error: ApiError) => live && setValue((v) => ({ ...v, state: 'error', error, loadingMore: false })),
    );
    return () => {
      live = false;
    };
    // `key` stands for base, query and sorting.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [key, tick]);

  const loadMore = useCallback(() => {
    const v = latest.current;
    if (!v.page || v.page.nextOffset === null || v.loadingMore) return;
    const at = key;
    setValue({ ...v, loadingMore: true, error: null });
    api<ListPage>('GET', pageUrl(base, query, sorting, v.page.nextOffset)).then(
      (page) => {
        if (asked.current !== at) return;
        setValue((w) => {
          const seen = new Set(w.rows.map((r) => r.clientId));
          return { ...w, rows: [...w.rows, ...page.clients.filter((r) => !seen.has(r.clientId))], page, loadingMore: false };
        });
      },
      (error: ApiError) => asked.current === at && setValue((w) => ({ ...w, error, loadingMore: false })),
    );
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [key]);

  const reload = useCallback(() => {
    kept.current = Math.min(MAX_PAGE, Math.max(PAGE_SIZE, latest.current.rows.length));
    setTick((t) => t + 1);
  }, []);
  return { ...value, loadMore, reload };
}

/** The first page's state, for `Loaded`: loading and error until it came, then the page (later pages report through `ShowMore`). */
export function firstPage(list: PagedRows): Loadable<ListPage> {
  if (list.state === 'ready' && list.page) return { state: 'ready', data: list.page };
  if (list.state === 'error' && list.error) return { state: 'error', error: list.error };
  return { state: 'loading' };
}
