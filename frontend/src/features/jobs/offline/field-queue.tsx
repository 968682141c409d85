import { createContext, useContext, useEffect, useMemo, useSyncExternalStore } from 'react';
import type { ReactNode } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { createStore, del, entries, set } from 'idb-keyval';
import { useCurrentUser } from '@/features/auth/auth-provider';
import { sessionStore } from '@/features/auth/session-store';
import { jobKeys } from '../api/job-cache';
import { postDayNote, postInstallEntry, uploadJobPhoto } from '../api/send-log-rows';
import {
  isRowOf,
  memoryQueueStorage,
  othersWaiting,
  RowQueue,
  type QueuedRow,
  type QueueStorage,
  type RowSender,
} from './row-queue';

/** IndexedDB through idb-keyval: one database, one store, the rows keyed by their clientRowId. */
export function idbQueueStorage(): QueueStorage {
  const store = createStore('loambook-field', 'outbox');
  return {
    durable: true,
    all: async () => (await entries<string, QueuedRow>(store)).map(([, row]) => row),
    put: (row) => set(row.clientRowId, row, store),
    remove: (id) => del(id, store),
  };
}

export const apiRowSender: RowSender = {
  entry: postInstallEntry,
  dayNote: postDayNote,
  photo: uploadJobPhoto,
};

/** Who is signed in, read from the store the API client takes its token from (so both always agree). */
export const sessionUserId = (): string | null => sessionStore.get()?.user.id ?? null;

let shared: RowQueue | null = null;

/** The app's one outbox (IndexedDB where the browser has it; memory, and a warning, where it has not). */
export function sharedRowQueue(): RowQueue {
  if (!shared) {
    const storage = typeof indexedDB === 'undefined' ? memoryQueueStorage(false) : idbQueueStorage();
    shared = new RowQueue(storage, apiRowSender, sessionUserId);
  }
  return shared;
}

const QueueContext = createContext<RowQueue | null>(null);

/** Tests hand in an outbox of their own (memory storage, the fake API behind fetch). */
export function FieldQueueProvider({ queue, children }: { queue: RowQueue; children: ReactNode }) {
  return <QueueContext.Provider value={queue}>{children}</QueueContext.Provider>;
}

/** While anything waits, another try this often, besides the browser's "online" event. */
const RETRY_MS = 15_000;

/**
 * Keeps the outbox moving while the app is open: a send when the browser says it is back online, every
 * RETRY_MS while rows wait, and once at the start. What was sent refreshes the job's log and actuals.
 */
function useQueueSync(queue: RowQueue, userId: string, waiting: number) {
  const queryClient = useQueryClient();
  // Again whenever someone else signs in on this phone: their own rows go then.
  useEffect(() => {
    const offSent = queue.onSent((sent) => {
      for (const id of new Set(sent.map((s) => s.jobId))) {
        void queryClient.invalidateQueries({ queryKey: jobKeys.log(id) });
        void queryClient.invalidateQueries({ queryKey: jobKeys.actuals(id) });
      }
    });
    const online = () => void queue.flush();
    window.addEventListener('online', online);
    void queue.ready().then(() => queue.flush());
    return () => {
      offSent();
      window.removeEventListener('online', online);
    };
  }, [queue, queryClient, userId]);

  useEffect(() => {
    if (!waiting) return;
    const timer = window.setInterval(() => void queue.flush(), RETRY_MS);
    return () => window.clearInterval(timer);
  }, [queue, waiting]);
}

function useQueueRows(queue: RowQueue) {
  return useSyncExternalStore(
    (l) => queue.subscribe(l),
    () => queue.snapshot(),
    () => queue.snapshot(),
  );
}

/**
 * The outbox for one job: the signed-in person's waiting rows (theirs to send, retry or discard), the
 * rows others left for this job on the phone (shown, never sent with this session), and a retry.
 */
export function useFieldQueue(jobId: string) {
  const provided = useContext(QueueContext);
  const queue = provided ?? sharedRowQueue();
  const user = useCurrentUser();
  const all = useQueueRows(queue);
  const forJob = useMemo(() => all.filter((r) => r.jobId === jobId), [all, jobId]);
  const rows = useMemo(() => forJob.filter((r) => isRowOf(r, user.id)), [forJob, user.id]);
  const others = useMemo(() => othersWaiting(forJob, user.id), [forJob, user.id]);
  const othersRows = useMemo(() => forJob.filter((r) => !isRowOf(r, user.id)), [forJob, user.id]);
  useQueueSync(queue, user.id, rows.length);

  return {
    queue,
    /** Who is entering rows now (each new row is tagged with them). */
    user: { id: user.id, name: user.name },
    rows,
    others,
    othersRows,
    add: (row: QueuedRow) => queue.add(row),
    retry: () => queue.retryAll(),
    discard: (clientRowId: string) => queue.discard(clientRowId),
    offline: queue.offline,
    durable: queue.durable,
  };
}

/**
 * The whole outbox, for the navigation: how many of the signed-in person's rows wait on this phone, and
 * their sending kept going on every screen (not only on the job's own), so that a row goes as soon as the
 * signal is back.
 */
export function useOutboxWaiting(): number {
  const provided = useContext(QueueContext);
  const queue = provided ?? sharedRowQueue();
  const user = useCurrentUser();
  const all = useQueueRows(queue);
  const mine = useMemo(() => all.filter((r) => isRowOf(r, user.id)).length, [all, user.id]);
  useQueueSync(queue, user.id, mine);
  return mine;
}

/** Rows other people left on this phone, on every job (for Today): they wait for their own sign-in. */
export function useOthersWaiting() {
  const provided = useContext(QueueContext);
  const queue = provided ?? sharedRowQueue();
  const user = useCurrentUser();
  const all = useQueueRows(queue);
  return useMemo(() => othersWaiting(all, user.id), [all, user.id]);
}
