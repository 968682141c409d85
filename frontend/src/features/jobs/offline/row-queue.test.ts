import { beforeEach, describe, expect, it, vi } from 'vitest';
import type { DayNote, InstallEntry, InstallEntryInput, JobPhoto } from '@loambook/common';
import { ApiError } from '@/lib/api-client';
import {
  memoryQueueStorage,
  othersWaiting,
  queuedBase,
  RowQueue,
  type QueuedEntry,
  type QueuedPhoto,
  type QueueUser,
  type RowSender,
} from './row-queue';

const JOB = 'job-1';
const HOLLIS: QueueUser = { id: 'user-hollis', name: 'Hollis Varga' };
const PELL: QueueUser = { id: 'user-pell', name: 'Pell Asante' };
/** Who is signed in, as the session store would say; the tests switch it. */
let signedIn: string | null = HOLLIS.id;
const whoIsSignedIn = () => signedIn;
const offline = () =>
  new ApiError(0, { code: 'NETWORK.UNREACHABLE', message: 'Loambook could not be reached.', details: null });

function entryRow(number: number, user: QueueUser = HOLLIS): QueuedEntry {
  const base = queuedBase(JOB, user);
  const body: InstallEntryInput = {
    clientRowId: base.clientRowId,
    kind: 'injection',
    number,
    pounds: '12.5',
    stopReason: 'surface_return',
    loggedAt: '2026-12-08T15:00:00.000Z',
  };
  return { ...base, type: 'entry', body };
}

const stored = (body: InstallEntryInput): InstallEntry =>
  ({ ...body, id: `srv-${body.number}` }) as unknown as InstallEntry;

/** A server that keeps each clientRowId once (201 new, 200 again), and a switch for the signal. */
function fakeServer() {
  const rows = new Map<string, InstallEntry>();
  const photos: { installEntryId: string | null }[] = [];
  let signal = true;
  const sender: RowSender = {
    entry: vi.fn(async (_job, body) => {
      if (!signal) throw offline();
      const row = rows.get(body.clientRowId) ?? stored(body);
      rows.set(body.clientRowId, row);
      return row;
    }),
    dayNote: vi.fn(async (_job, body) => {
      if (!signal) throw offline();
      return { ...body, id: 'note-1' } as DayNote;
    }),
    photo: vi.fn(async (_job, p) => {
      if (!signal) throw offline();
      photos.push({ installEntryId: p.installEntryId });
      return { id: `ph-${photos.length}` } as JobPhoto;
    }),
  };
  return { sender, rows, photos, setSignal: (on: boolean) => (signal = on) };
}

function photoRow(user: QueueUser = HOLLIS): QueuedPhoto {
  return {
    ...queuedBase(JOB, user),
    type: 'photo',
    file: new Blob(['jpeg'], { type: 'image/jpeg' }),
    fileName: 'site.jpg',
    caption: 'Site',
    entryClientRowId: null,
    installEntryId: null,
  };
}

describe('the crew’s outbox', () => {
  beforeEach(() => {
    signedIn = HOLLIS.id;
  });

  it('keeps every row through a lost signal and sends them all, in order, when it is back', async () => {
    const server = fakeServer();
    const storage = memoryQueueStorage();
    const queue = new RowQueue(storage, server.sender, whoIsSignedIn);
    await queue.ready();

    await queue.add(entryRow(1));
    await queue.flush();
    expect(server.rows.size).toBe(1);
    expect(queue.snapshot()).toHaveLength(0);

    server.setSignal(false);
    await queue.add(entryRow(2));
    await queue.add(entryRow(3));
    const tried = await queue.flush();
    expect(tried.offline).toBe(true);
    // Both rows are still on the phone, in storage as well as on screen, with the reason.
    expect(queue.snapshot().map((r) => (r.type === 'entry' ? r.body.number : 0))).toEqual([2, 3]);
    expect((await storage.all()).length).toBe(2);
    expect(queue.snapshot()[0]?.lastError).toMatch(/could not be reached/);
    expect(queue.offline).toBe(true);

    // A reload of the page reads them back from storage.
    const afterReload = new RowQueue(storage, server.sender, whoIsSignedIn);
    await afterReload.ready();
    expect(afterReload.snapshot()).toHaveLength(2);

    server.setSignal(true);
    const sent = await afterReload.flush();
    expect(sent.sent.map((s) => (s.type === 'entry' ? s.result.number : 0))).toEqual([2, 3]);
    expect(afterReload.snapshot()).toHaveLength(0);
    expect(await storage.all()).toHaveLength(0);
    expect([...server.rows.values()].map((r) => r.number).sort()).toEqual([1, 2, 3]);
  });

  it('removes a row when the server already had it (200 on a resend), without a second row', async () => {
    const server = fakeServer();
    const queue = new RowQueue(memoryQueueStorage(), server.sender, whoIsSignedIn);
    const row = entryRow(4);
    // The first send reached the server but its answer was lost.
    server.rows.set(row.clientRowId, stored(row.body));
    await queue.add(row);
    await queue.flush();
    expect(queue.snapshot()).toHaveLength(0);
    expect(server.rows.size).toBe(1);
  });

  it('keeps a refused row with the server’s reason, sends the rest, and retries it on request', async () => {
    const server = fakeServer();
    let started = false;
    const sender: RowSender = {
      ...server.sender,
      entry: async (job, body) => {
        if (!started)
          throw new ApiError(409, {
            code: 'JOB.NOT_STARTED',
            message: 'Start the job first.',
            details: null,
          });
        return server.sender.entry(job, body);
      },
    };
    const queue = new RowQueue(memoryQueueStorage(), sender, whoIsSignedIn);
    await queue.add(entryRow(1));
    await queue.add({
      ...queuedBase(JOB, HOLLIS),
      type: 'dayNote',
      body: { clientRowId: 'n1', workDate: '2026-12-08', labourHours: '16' },
    });
    await queue.flush();
    expect(queue.snapshot()).toHaveLength(1);
    expect(queue.snapshot()[0]?.refused).toEqual({
      code: 'JOB.NOT_STARTED',
      message: 'Start the job first.',
    });

    started = true;
    await queue.retryAll();
    expect(queue.snapshot()).toHaveLength(0);
    expect(server.rows.size).toBe(1);
  });

  it('sends a point’s photo after its row, with the row’s server id', async () => {
    const server = fakeServer();
    const queue = new RowQueue(memoryQueueStorage(), server.sender, whoIsSignedIn);
    server.setSignal(false);
    const row = entryRow(7);
    await queue.add(row);
    const photo: QueuedPhoto = {
      ...queuedBase(JOB, HOLLIS),
      type: 'photo',
      file: new Blob(['jpeg'], { type: 'image/jpeg' }),
      fileName: 'point-7.jpg',
      caption: 'Point 7',
      entryClientRowId: row.clientRowId,
      installEntryId: null,
    };
    await queue.add(photo);
    await queue.flush();
    expect(queue.snapshot()).toHaveLength(2);

    server.setSignal(true);
    await queue.flush();
    expect(queue.snapshot()).toHaveLength(0);
    expect(server.photos).toEqual([{ installEntryId: 'srv-7' }]);
  });

  it('never runs two sends of the same row at once', async () => {
    const server = fakeServer();
    const queue = new RowQueue(memoryQueueStorage(), server.sender, whoIsSignedIn);
    await queue.ready();
    await queue.add(entryRow(1));
    await Promise.all([queue.flush(), queue.flush(), queue.flush()]);
    expect(server.sender.entry).toHaveBeenCalledTimes(1);
  });

  it('sends only the signed-in person’s rows; another’s wait on the phone for them, never dropped', async () => {
    const server = fakeServer();
    const storage = memoryQueueStorage();
    const queue = new RowQueue(storage, server.sender, whoIsSignedIn);
    await queue.ready();
    // Hollis logs two points without signal, then signs out; Pell signs in on the same phone.
    server.setSignal(false);
    await queue.add(entryRow(1));
    await queue.add(entryRow(2));
    await queue.flush();
    signedIn = PELL.id;
    server.setSignal(true);
    await queue.add(entryRow(3, PELL));
    const sent = await queue.flush();

    // Only Pell's row went (with Pell's session); Hollis's two are still stored, and named as theirs.
    expect([...server.rows.values()].map((r) => r.number)).toEqual([3]);
    expect(sent.waiting).toBe(0);
    expect(await storage.all()).toHaveLength(2);
    expect(othersWaiting(queue.snapshot(), PELL.id)).toEqual([
      { userId: HOLLIS.id, userName: 'Hollis Varga', count: 2 },
    ]);
    // Pell can neither discard them nor clear their marks.
    const hollisRow = queue.snapshot()[0]!;
    await expect(queue.discard(hollisRow.clientRowId)).rejects.toThrow(/someone else/);
    await queue.retryAll();
    expect(server.rows.size).toBe(1);
    expect(await storage.all()).toHaveLength(2);

    // Nobody signed in: nothing goes either.
    signedIn = null;
    await queue.flush();
    expect(server.rows.size).toBe(1);

    // Hollis signs in again: their rows go, in order, under their session.
    signedIn = HOLLIS.id;
    const theirs = await queue.flush();
    expect(theirs.sent.map((r) => (r.type === 'entry' ? r.result.number : 0))).toEqual([1, 2]);
    expect(await storage.all()).toHaveLength(0);
  });

  it('checks who is signed in right before each send, not once per flush', async () => {
    const server = fakeServer();
    const sender: RowSender = {
      ...server.sender,
      entry: async (job, body) => {
        const row = await server.sender.entry(job, body);
        // Hollis's session ends while the first row is on its way; Pell signs in.
        signedIn = PELL.id;
        return row;
      },
    };
    const queue = new RowQueue(memoryQueueStorage(), sender, whoIsSignedIn);
    await queue.ready();
    server.setSignal(false);
    await queue.add(entryRow(1));
    await queue.add(entryRow(2));
    await queue.flush();
    server.setSignal(true);
    await queue.flush();
    expect([...server.rows.values()].map((r) => r.number)).toEqual([1]);
    expect(queue.snapshot().map((r) => (r.type === 'entry' ? r.body.number : 0))).toEqual([2]);
  });

  it('does not count a row from before rows were tagged as anyone’s (it waits, named as unknown)', async () => {
    const server = fakeServer();
    const storage = memoryQueueStorage();
    const { userId: _u, userName: _n, ...untagged } = entryRow(9);
    await storage.put(untagged as unknown as QueuedEntry);
    const queue = new RowQueue(storage, server.sender, whoIsSignedIn);
    await queue.ready();
    await queue.flush();
    expect(server.rows.size).toBe(0);
    expect(othersWaiting(queue.snapshot(), HOLLIS.id)).toEqual([
      { userId: '', userName: 'someone else', count: 1 },
    ]);
  });

  it('sends each photo with its own client id, the same on every try, so a resend is not a second photo', async () => {
    const stored = new Map<string, JobPhoto>();
    let loseAnswer = true;
    const server = fakeServer();
    const sender: RowSender = {
      ...server.sender,
      photo: vi.fn(async (_job, p) => {
        // The server keeps a photo once per client id (200 with the stored one on a resend).
        const photo = stored.get(p.clientPhotoId) ?? ({ id: `ph-${stored.size + 1}` } as JobPhoto);
        stored.set(p.clientPhotoId, photo);
        if (loseAnswer) {
          loseAnswer = false;
          throw offline(); // stored, but the answer was lost with the signal
        }
        return photo;
      }),
    };
    const queue = new RowQueue(memoryQueueStorage(), sender, whoIsSignedIn);
    const row = photoRow();
    await queue.add(row);
    await queue.flush();
    expect(queue.snapshot()).toHaveLength(1);
    await queue.flush();
    expect(queue.snapshot()).toHaveLength(0);
    const ids = vi.mocked(sender.photo).mock.calls.map(([, p]) => p.clientPhotoId);
    expect(ids).toEqual([row.clientRowId, row.clientRowId]);
    expect(stored.size).toBe(1);
  });
});
