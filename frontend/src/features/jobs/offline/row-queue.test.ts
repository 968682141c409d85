import { describe, expect, it, vi } from 'vitest';
import type { DayNote, InstallEntry, InstallEntryInput, JobPhoto } from '@loambook/common';
import { ApiError } from '@/lib/api-client';
import {
  memoryQueueStorage,
  queuedBase,
  RowQueue,
  type QueuedEntry,
  type QueuedPhoto,
  type RowSender,
} from './row-queue';

const JOB = 'job-1';
const offline = () =>
  new ApiError(0, { code: 'NETWORK.UNREACHABLE', message: 'Loambook could not be reached.', details: null });

function entryRow(number: number): QueuedEntry {
  const base = queuedBase(JOB);
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

describe('the crew’s outbox', () => {
  it('keeps every row through a lost signal and sends them all, in order, when it is back', async () => {
    const server = fakeServer();
    const storage = memoryQueueStorage();
    const queue = new RowQueue(storage, server.sender);
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
    const afterReload = new RowQueue(storage, server.sender);
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
    const queue = new RowQueue(memoryQueueStorage(), server.sender);
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
    const queue = new RowQueue(memoryQueueStorage(), sender);
    await queue.add(entryRow(1));
    await queue.add({
      ...queuedBase(JOB),
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
    const queue = new RowQueue(memoryQueueStorage(), server.sender);
    server.setSignal(false);
    const row = entryRow(7);
    await queue.add(row);
    const photo: QueuedPhoto = {
      ...queuedBase(JOB),
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
    const queue = new RowQueue(memoryQueueStorage(), server.sender);
    await queue.ready();
    await queue.add(entryRow(1));
    await Promise.all([queue.flush(), queue.flush(), queue.flush()]);
    expect(server.sender.entry).toHaveBeenCalledTimes(1);
  });
});
