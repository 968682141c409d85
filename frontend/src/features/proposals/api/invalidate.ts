import type { QueryClient } from '@tanstack/react-query';

/**
 * What a change to a proposal can make stale: the proposal lists and details, the lead (its stage, value
 * and timeline), the approval queue and the lead's contract. Awaited, so that the screen shows the new
 * state when the mutation settles.
 */
export async function invalidateSelling(queryClient: QueryClient): Promise<void> {
  await Promise.all([
    queryClient.invalidateQueries({ queryKey: ['proposals'] }),
    queryClient.invalidateQueries({ queryKey: ['leads'] }),
    queryClient.invalidateQueries({ queryKey: ['approvals'] }),
    queryClient.invalidateQueries({ queryKey: ['contracts'] }),
  ]);
}
