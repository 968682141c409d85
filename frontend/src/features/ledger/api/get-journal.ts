import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { JournalPage } from '@loambook/common';
import { api } from '@/lib/api-client';

export const JOURNAL_PAGE_SIZES = [10, 25, 50, 100] as const;
export type JournalPageSize = (typeof JOURNAL_PAGE_SIZES)[number];

/** What the journal asks for; every filter is applied by the server. Dates are YYYY-MM-DD or ''. */
export interface JournalQuery {
  branchId: string | null;
  from: string;
  to: string;
  reasonCode: string;
  page: number;
  pageSize: JournalPageSize;
}

/** The query string of the journal, shared by the page and its CSV export. */
export function journalParams(q: Omit<JournalQuery, 'page' | 'pageSize'>): Record<string, string | null> {
  return { branchId: q.branchId, from: q.from, to: q.to, reasonCode: q.reasonCode };
}

export function getJournal(q: JournalQuery, signal?: AbortSignal): Promise<JournalPage> {
  return api.get<JournalPage>('/ledger/journal', {
    query: { ...journalParams(q), page: String(q.page), pageSize: String(q.pageSize) },
    signal,
  });
}

export const journalQueryOptions = (q: JournalQuery) =>
  queryOptions({
    queryKey: ['ledger', 'journal', q],
    queryFn: ({ signal }) => getJournal(q, signal),
    placeholderData: keepPreviousData,
  });

export function useJournal(q: JournalQuery) {
  return useQuery(journalQueryOptions(q));
}
