import { Message } from 'primereact/message';
import { isApiError } from '@/lib/api-client';

/** A failed request, in the server's words, with the request id to quote when calling for help. */
export function ApiErrorMessage({ error, className }: { error: unknown; className?: string }) {
  const message = isApiError(error) ? error.message : 'Something went wrong. Try again.';
  const requestId = isApiError(error) && error.status >= 500 ? error.requestId : '';
  return (
    <Message
      severity="error"
      className={['api-error', className].filter(Boolean).join(' ')}
      content={
        <span>
          {message}
          {requestId ? <span className="api-error__request"> (request {requestId})</span> : null}
        </span>
      }
    />
  );
}
