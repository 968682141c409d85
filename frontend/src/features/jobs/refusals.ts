import { isApiError } from '@/lib/api-client';

/** The API's refusal codes for jobs, as a headline for the office and the crew; the detail is the server's. */
export const REFUSAL_TITLES: Record<string, string> = {
  'JOB.INSIDE_CANCELLATION_WINDOW': 'The homeowner can still cancel',
  'JOB.BEFORE_DIG_DATE': 'Too early to dig',
  'JOB.NO_LOCATE_TICKET': 'No 811 locate ticket on file',
  'JOB.LOCATE_EXPIRED': 'The 811 locate ticket has expired',
  'JOB.DEPOSIT_NOT_RECEIVED': 'The deposit has not been received',
  'JOB.NOT_STARTED': 'The job has not been started',
  'JOB.ALREADY_COMPLETED': 'The job is already completed',
};

export interface Refusal {
  title: string;
  message: string;
  code: string;
}

/** What to say about a failed request: a title for a known refusal, the server's own words below it. */
export function refusalOf(error: unknown): Refusal {
  if (!isApiError(error))
    return { title: 'That did not work', message: 'Something went wrong. Try again.', code: '' };
  return {
    title: REFUSAL_TITLES[error.code] ?? (error.status === 409 ? 'Not possible now' : 'That did not work'),
    message: error.message,
    code: error.code,
  };
}
