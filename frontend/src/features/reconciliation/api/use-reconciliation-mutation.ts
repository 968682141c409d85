import { useMutation, useQueryClient } from '@tanstack/react-query';

/**
 * A workspace change (suggest, confirm, undo, match by hand, lock): every reconciliation view is asked for
 * again before the mutation settles, since the lists on both sides change together.
 */
export function useReconciliationMutation<I, O>(fn: (input: I) => Promise<O>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSettled: () => queryClient.invalidateQueries({ queryKey: ['reconciliation'] }),
  });
}
