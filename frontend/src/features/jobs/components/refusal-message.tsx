import { Message } from 'primereact/message';
import { refusalOf } from '../refusals';

/** A refusal from the API as a clear message: what is wrong, then the server's explanation. */
export function RefusalMessage({ error, className }: { error: unknown; className?: string }) {
  const r = refusalOf(error);
  return (
    <Message
      severity="error"
      className={['refusal', className].filter(Boolean).join(' ')}
      content={
        <span role="alert">
          <strong className="refusal__title">{r.title}.</strong> <span>{r.message}</span>
        </span>
      }
    />
  );
}
