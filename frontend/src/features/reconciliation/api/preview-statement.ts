import { keepPreviousData, queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import type { BankCsvMapping, BankStatementPreview } from '@loambook/common';
import { postCsv, type UploadProgress } from './csv-transport';

export interface PreviewInput {
  file: File;
  bankAccountId: string | null;
  /** Read the file with this mapping (its result comes back as `check`). */
  mapping?: BankCsvMapping | null;
  onProgress?: (p: UploadProgress) => void;
}

/** Sends the file for a look: the first rows, a first mapping and, with a mapping, the rows it reads. Stores nothing. */
export function previewStatement({ file, bankAccountId, mapping, onProgress }: PreviewInput) {
  return postCsv<BankStatementPreview>(
    '/bank-statements/preview',
    file,
    { bankAccountId, mapping: mapping ? JSON.stringify(mapping) : null },
    onProgress,
  );
}

export function usePreviewStatement() {
  return useMutation({ mutationFn: previewStatement });
}

/** The file read again with the mapping being chosen: the lines and row errors it gives. */
export const statementCheckQueryOptions = (
  file: File | null,
  bankAccountId: string | null,
  mapping: BankCsvMapping | null,
) =>
  queryOptions({
    queryKey: [
      'reconciliation',
      'statement-check',
      file ? `${file.name}:${file.size}:${file.lastModified}` : null,
      bankAccountId,
      mapping,
    ],
    queryFn: () => previewStatement({ file: file!, bankAccountId, mapping }),
    enabled: file !== null && mapping !== null,
    placeholderData: keepPreviousData,
    staleTime: Infinity,
  });

export function useStatementCheck(
  file: File | null,
  bankAccountId: string | null,
  mapping: BankCsvMapping | null,
) {
  return useQuery(statementCheckQueryOptions(file, bankAccountId, mapping));
}
