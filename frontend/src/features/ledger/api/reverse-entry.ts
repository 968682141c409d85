import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { JournalEntry, ReverseEntryRequest } from '@loambook/common';
import { api } from '@/lib/api-client';

export function reverseEntry(entryId: string, body: ReverseEntryRequest): Promise<JournalEntry> {
  return api.post<JournalEntry>(`/ledger/entries/${encodeURIComponent(entryId)}/reverse`, body);
}

/** Posts the reversing entry; every ledger view is asked for again before the mutation settles. */
export function useReverseEntry() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ entryId, reason }: { entryId: string; reason: string }) =>
      reverseEntry(entryId, { reason }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['ledger'] }),
  });
}
