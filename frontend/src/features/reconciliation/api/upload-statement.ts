import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BankCsvMapping, BankStatement } from '@loambook/common';
import { postCsv, type UploadProgress } from './csv-transport';

export interface UploadInput {
  file: File;
  bankAccountId: string;
  mapping: BankCsvMapping;
  skipInvalidRows: boolean;
  periodFrom?: string;
  periodTo?: string;
  onProgress?: (p: UploadProgress) => void;
}

export function uploadStatement({
  file,
  bankAccountId,
  mapping,
  skipInvalidRows,
  periodFrom,
  periodTo,
  onProgress,
}: UploadInput) {
  return postCsv<BankStatement>(
    '/bank-statements',
    file,
    {
      bankAccountId,
      mapping: JSON.stringify(mapping),
      skipInvalidRows: skipInvalidRows ? 'true' : 'false',
      periodFrom,
      periodTo,
    },
    onProgress,
  );
}

/** Stores the statement; the accounts (saved mapping, dates), statements and workspace are asked for again. */
export function useUploadStatement() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: uploadStatement,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['reconciliation'] }),
  });
}
