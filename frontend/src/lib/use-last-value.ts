import { useState } from 'react';

/**
 * The value, or the last non-null one while it is null: a dialog closing (value → null) keeps showing its
 * content during the closing animation instead of going blank.
 */
export function useLastValue<T>(value: T | null): T | null {
  const [last, setLast] = useState<T | null>(value);
  if (value !== null && value !== last) setLast(value);
  return value ?? last;
}
