import type { DayNote, DayNoteInput, InstallEntry, InstallEntryInput, JobPhoto } from '@loambook/common';
import { isApiError } from '@/lib/api-client';

/*
 * The crew's outbox. Every row the crew lead enters is written here first (IndexedDB on the phone) and only
 * then sent. A row leaves the outbox when the server has it: 201 (new) or 200 (it already had that
 * clientRowId, e.g. the answer to an earlier send was lost with the signal). A network failure leaves it
 * waiting; it goes again when the browser is back online, on a timer, or on the retry button. A row the
 * server refuses (a 4xx with a reason) stays too, marked with the reason: nothing entered is dropped
 * without the crew lead choosing to.
 *
 * The outbox belongs to the phone, the rows to the person who entered them: each row carries the id of
 * whoever was signed in when it was queued, and only that person's session sends it. Rows another person
 * left on the phone wait for them to sign in again (the screens say so); they are never sent under someone
 * else's name, nor dropped.
 */

/** Who entered a row: the signed-in person when it was queued. */
export interface QueueUser {
  id: string;
  name: string;
}

interface QueuedBase {
  /** The row's own id (uuid): the entry's or note's clientRowId, or the photo's outbox id. */
  clientRowId: string;
  jobId: string;
  /** The person signed in when the row was queued; only their session sends it. */
  userId: string;
  /** Their name, for the screen to say whose rows wait when someone else is signed in. */
  userName: string;
  queuedAt: string;
  attempts: number;
  /** The last failure, for the screen ("No signal", the server's reason). */
  lastError: string | null;
  /** The server refused the row itself (4xx): it stays until the crew lead retries or discards it. */
  refused: { code: string; message: string } | null;
}

export interface QueuedEntry extends QueuedBase {
  type: 'entry';
  body: InstallEntryInput;
}

export interface QueuedDayNote extends QueuedBase {
  type: 'dayNote';
  body: DayNoteInput;
}

export interface QueuedPhoto extends QueuedBase {
  type: 'photo';
  file: Blob;
  fileName: string;
  caption: string | null;
  /** The install-log row the photo belongs to, by its clientRowId, while that row is still waiting. */
  entryClientRowId: string | null;
  /** The stored row's server id, once known. */
  installEntryId: string | null;
}

export type QueuedRow = QueuedEntry | QueuedDayNote | QueuedPhoto;

/** Where the outbox lives: IndexedDB in the browser, memory in the tests. */
export interface QueueStorage {
  all(): Promise<QueuedRow[]>;
  put(row: QueuedRow): Promise<void>;
  remove(clientRowId: string): Promise<void>;
  /** False when the rows would not survive a reload (no IndexedDB in this browser). */
  readonly durable: boolean;
}

export function memoryQueueStorage(durable = true): QueueStorage {
  const rows = new Map<string, QueuedRow>();
  return {
    durable,
    all: async () => [...rows.values()],
    put: async (row) => {
      rows.set(row.clientRowId, row);
    },
    remove: async (id) => {
      rows.delete(id);
    },
  };
}

/** What sends a row; the real one posts to the API, the tests pass their own. */
export interface RowSender {
  entry(jobId: string, body: InstallEntryInput): Promise<InstallEntry>;
  dayNote(jobId: string, body: DayNoteInput): Promise<DayNote>;
  photo(
    jobId: string,
    photo: {
      file: Blob;
      fileName: string;
      caption: string | null;
      installEntryId: string | null;
      /** The outbox row's id: a resend of the same photo finds it stored (200), not a second photo. */
      clientPhotoId: string;
    },
  ): Promise<JobPhoto>;
}

export type SentRow =
  | { type: 'entry'; jobId: string; clientRowId: string; result: InstallEntry }
  | { type: 'dayNote'; jobId: string; clientRowId: string; result: DayNote }
  | { type: 'photo'; jobId: string; clientRowId: string; result: JobPhoto };

export interface FlushResult {
  sent: SentRow[];
  /** Stopped on a network failure: the rows after it were not tried. */
  offline: boolean;
  /** The signed-in person's rows still waiting (others' rows are not counted: they are not theirs to send). */
  waiting: number;
}

/** Another person's rows waiting on this phone, per person. */
export interface OthersWaiting {
  userId: string;
  userName: string;
  count: number;
}

/** Whether the row was entered by this person (a row from before rows were tagged belongs to nobody). */
export const isRowOf = (row: QueuedRow, userId: string | null): boolean =>
  userId !== null && typeof row.userId === 'string' && row.userId === userId;

/** The rows entered by others than `userId`, grouped by person, the most rows first. */
export function othersWaiting(rows: readonly QueuedRow[], userId: string | null): OthersWaiting[] {
  const byUser = new Map<string, OthersWaiting>();
  for (const r of rows) {
    if (isRowOf(r, userId)) continue;
    const key = typeof r.userId === 'string' ? r.userId : '';
    const known = byUser.get(key);
    if (known) known.count += 1;
    else byUser.set(key, { userId: key, userName: r.userName || 'someone else', count: 1 });
  }
  return [...byUser.values()].sort((a, b) => b.count - a.count || a.userName.localeCompare(b.userName));
}

/** A failure that says nothing about the row: try the same row again later. */
export function isTransient(error: unknown): boolean {
  if (!isApiError(error)) return true;
  return (
    error.status === 0 ||
    error.status === 401 ||
    error.status === 408 ||
    error.status === 429 ||
    error.status >= 500
  );
}

const byQueuedAt = (a: QueuedRow, b: QueuedRow) =>
  a.queuedAt === b.queuedAt ? 0 : a.queuedAt < b.queuedAt ? -1 : 1;

type Listener = () => void;

export class RowQueue {
  private rows: QueuedRow[] = [];
  private loaded: Promise<void>;
  private flushing: Promise<FlushResult> | null = null;
  private again = false;
  private listeners = new Set<Listener>();
  private sentListeners = new Set<(rows: SentRow[]) => void>();
  private snapshotCache: readonly QueuedRow[] = [];
  /** Whether the last attempt failed for want of a network. */
  offline = false;

  /**
   * @param currentUserId who is signed in right now (null: nobody). Read again just before each send, from
   * the same place the API client takes its token from, so that a row never goes with another's session.
   */
  constructor(
    private readonly storage: QueueStorage,
    private readonly sender: RowSender,
    private readonly currentUserId: () => string | null,
  ) {
    this.loaded = this.reload();
  }

  private mine(row: QueuedRow): boolean {
    return isRowOf(row, this.currentUserId());
  }

  get durable(): boolean {
    return this.storage.durable;
  }

  private async reload(): Promise<void> {
    try {
      this.rows = (await this.storage.all()).sort(byQueuedAt);
    } catch {
      this.rows = [];
    }
    this.emit();
  }

  /** Ready once the rows kept from an earlier visit have been read. */
  ready(): Promise<void> {
    return this.loaded;
  }

  subscribe(listener: Listener): () => void {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  }

  onSent(listener: (rows: SentRow[]) => void): () => void {
    this.sentListeners.add(listener);
    return () => this.sentListeners.delete(listener);
  }

  private emit() {
    this.snapshotCache = [...this.rows];
    for (const l of this.listeners) l();
  }

  /** The rows waiting, oldest first (a stable array between changes, for useSyncExternalStore). */
  snapshot(): readonly QueuedRow[] {
    return this.snapshotCache;
  }

  /**
   * Keeps the row on the phone, then tries to send everything waiting. Resolves once the row is stored
   * locally (it throws only when even that failed: the screen must then say the row was not kept).
   */
  async add(row: QueuedRow): Promise<void> {
    await this.loaded;
    await this.storage.put(row);
    this.rows = [...this.rows.filter((r) => r.clientRowId !== row.clientRowId), row].sort(byQueuedAt);
    this.emit();
    void this.flush();
  }

  /** Clears the refusal marks of the signed-in person's rows (they fixed the cause) and sends again. */
  async retryAll(): Promise<FlushResult> {
    await this.loaded;
    for (const row of this.rows) {
      if (row.refused && this.mine(row)) {
        const next = { ...row, refused: null };
        await this.storage.put(next);
        this.replace(next);
      }
    }
    this.emit();
    return this.flush();
  }

  /**
   * Removes one row the crew lead has chosen to give up (after a confirmation on the screen). Only their
   * own: another person's rows stay for them.
   */
  async discard(clientRowId: string): Promise<void> {
    await this.loaded;
    const row = this.rows.find((r) => r.clientRowId === clientRowId);
    if (!row) return;
    if (!this.mine(row)) throw new Error('This row was entered by someone else: it stays for them.');
    await this.storage.remove(clientRowId);
    this.rows = this.rows.filter((r) => r.clientRowId !== clientRowId);
    this.emit();
  }

  private replace(row: QueuedRow) {
    this.rows = this.rows.map((r) => (r.clientRowId === row.clientRowId ? row : r));
  }

  /** Sends the signed-in person's waiting rows in the order they were entered; one flush at a time. */
  flush(): Promise<FlushResult> {
    if (this.flushing) {
      this.again = true;
      return this.flushing;
    }
    this.flushing = (async () => {
      let result: FlushResult;
      do {
        this.again = false;
        result = await this.flushOnce();
      } while (this.again && !result.offline);
      return result;
    })().finally(() => {
      this.flushing = null;
    });
    return this.flushing;
  }

  private async flushOnce(): Promise<FlushResult> {
    await this.loaded;
    const sent: SentRow[] = [];
    let offline = false;
    for (const original of [...this.rows]) {
      // The row may have changed (a photo learning its entry's id) since the loop started.
      const row = this.rows.find((r) => r.clientRowId === original.clientRowId);
      if (!row || row.refused || !this.mine(row)) continue;
      if (row.type === 'photo' && !row.installEntryId && row.entryClientRowId) {
        // Its install-log row is still waiting (or refused): the photo goes after it.
        if (this.rows.some((r) => r.clientRowId === row.entryClientRowId)) continue;
      }
      try {
        // Checked again right before the send (someone may have signed in or out since the loop started).
        if (!this.mine(row)) break;
        const done = await this.send(row);
        sent.push(done);
        await this.storage.remove(row.clientRowId);
        this.rows = this.rows.filter((r) => r.clientRowId !== row.clientRowId);
        if (done.type === 'entry') await this.linkPhotos(row.clientRowId, done.result.id);
        this.offline = false;
        this.emit();
      } catch (error) {
        const message = isApiError(error) ? error.message : 'The row could not be sent.';
        if (isTransient(error)) {
          const next: QueuedRow = { ...row, attempts: row.attempts + 1, lastError: message };
          await this.storage.put(next).catch(() => undefined);
          this.replace(next);
          offline = !isApiError(error) || error.status === 0;
          this.offline = offline;
          this.emit();
          break;
        }
        const code = isApiError(error) ? error.code : 'UNKNOWN';
        const next: QueuedRow = {
          ...row,
          attempts: row.attempts + 1,
          lastError: message,
          refused: { code, message },
        };
        await this.storage.put(next).catch(() => undefined);
        this.replace(next);
        this.emit();
      }
    }
    if (sent.length) for (const l of this.sentListeners) l(sent);
    return { sent, offline, waiting: this.rows.filter((r) => this.mine(r)).length };
  }

  private async linkPhotos(entryClientRowId: string, installEntryId: string) {
    for (const r of this.rows) {
      if (r.type === 'photo' && r.entryClientRowId === entryClientRowId && !r.installEntryId) {
        const next: QueuedPhoto = { ...r, installEntryId };
        await this.storage.put(next);
        this.replace(next);
      }
    }
  }

  private async send(row: QueuedRow): Promise<SentRow> {
    switch (row.type) {
      case 'entry':
        return {
          type: 'entry',
          jobId: row.jobId,
          clientRowId: row.clientRowId,
          result: await this.sender.entry(row.jobId, row.body),
        };
      case 'dayNote':
        return {
          type: 'dayNote',
          jobId: row.jobId,
          clientRowId: row.clientRowId,
          result: await this.sender.dayNote(row.jobId, row.body),
        };
      case 'photo':
        return {
          type: 'photo',
          jobId: row.jobId,
          clientRowId: row.clientRowId,
          result: await this.sender.photo(row.jobId, {
            file: row.file,
            fileName: row.fileName,
            caption: row.caption,
            installEntryId: row.installEntryId,
            clientPhotoId: row.clientRowId,
          }),
        };
    }
  }
}

/** A fresh uuid for a row (the phone's id for it; the server keeps each one once). */
export function newRowId(): string {
  if (typeof crypto !== 'undefined' && typeof crypto.randomUUID === 'function') return crypto.randomUUID();
  // crypto.randomUUID needs a secure context; a plain-http address on the LAN has crypto.getRandomValues.
  const b = crypto.getRandomValues(new Uint8Array(16));
  b[6] = (b[6]! & 0x0f) | 0x40;
  b[8] = (b[8]! & 0x3f) | 0x80;
  const h = [...b].map((x) => x.toString(16).padStart(2, '0')).join('');
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-${h.slice(12, 16)}-${h.slice(16, 20)}-${h.slice(20)}`;
}

let lastQueuedMs = 0;

/**
 * The common fields of a new outbox row, tagged with the person entering it; queuedAt never repeats, so
 * the order survives a reload.
 */
export function queuedBase(jobId: string, user: QueueUser, clientRowId = newRowId()): QueuedBase {
  lastQueuedMs = Math.max(Date.now(), lastQueuedMs + 1);
  return {
    clientRowId,
    jobId,
    userId: user.id,
    userName: user.name,
    queuedAt: new Date(lastQueuedMs).toISOString(),
    attempts: 0,
    lastError: null,
    refused: null,
  };
}
