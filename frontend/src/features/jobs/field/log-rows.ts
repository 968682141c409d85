import {
  helicalCapacity,
  money,
  type DayNote,
  type InstallEntry,
  type InstallEntryInput,
  type InstallKind,
  type InstallLogResponse,
} from '@loambook/common';
import type { QueuedDayNote, QueuedEntry, QueuedPhoto, QueuedRow } from '../offline/row-queue';

/** One row of the log as the crew lead sees it: stored on the server, or still on the phone. */
export interface LogRow {
  clientRowId: string;
  /** The server's id once stored. */
  id: string | null;
  kind: InstallKind;
  number: number;
  location: string | null;
  locationFt: string | null;
  depthFt: string | null;
  pounds: string | null;
  stopReason: InstallEntryInput['stopReason'];
  finalPressurePsi: string | null;
  torqueFtLb: string | null;
  shaft: InstallEntryInput['shaft'];
  designLoadLb: string | null;
  capacityAllowableLb: string | null;
  belowDesignLoad: boolean | null;
  note: string | null;
  loggedAt: string;
  state: 'stored' | 'waiting' | 'refused';
  refusal: string | null;
  photos: number;
  photosWaiting: number;
}

/** The allowable capacity from the torque, worked out on the phone the way the server does (Qu = Kt·T, /2). */
export function localCapacity(body: Pick<InstallEntryInput, 'shaft' | 'torqueFtLb' | 'designLoadLb'>): {
  allowableLb: string | null;
  below: boolean | null;
} {
  if (!body.shaft || !body.torqueFtLb) return { allowableLb: null, below: null };
  try {
    const r = helicalCapacity({
      shaft: body.shaft,
      torqueFtLb: body.torqueFtLb,
      ...(body.designLoadLb ? { designLoadLb: body.designLoadLb } : {}),
    });
    return {
      allowableLb: r.allowableLb ?? null,
      below: r.meetsDesignLoad === undefined ? null : !r.meetsDesignLoad,
    };
  } catch {
    return { allowableLb: null, below: null };
  }
}

const fromQueued = (q: QueuedEntry, photosWaiting: number): LogRow => {
  const cap = q.body.kind === 'helical_pile' ? localCapacity(q.body) : { allowableLb: null, below: null };
  return {
    clientRowId: q.clientRowId,
    id: null,
    kind: q.body.kind,
    number: q.body.number,
    location: q.body.location ?? null,
    locationFt: q.body.locationFt ?? null,
    depthFt: q.body.depthFt ?? null,
    pounds: q.body.pounds ?? null,
    stopReason: q.body.stopReason ?? null,
    finalPressurePsi: q.body.finalPressurePsi ?? null,
    torqueFtLb: q.body.torqueFtLb ?? null,
    shaft: q.body.shaft ?? null,
    designLoadLb: q.body.designLoadLb ?? null,
    capacityAllowableLb: cap.allowableLb,
    belowDesignLoad: cap.below,
    note: q.body.note ?? null,
    loggedAt: q.body.loggedAt,
    state: q.refused ? 'refused' : 'waiting',
    refusal: q.refused?.message ?? null,
    photos: 0,
    photosWaiting,
  };
};

const fromStored = (e: InstallEntry, photosWaiting: number): LogRow => ({
  clientRowId: e.clientRowId,
  id: e.id,
  kind: e.kind,
  number: e.number,
  location: e.location,
  locationFt: e.locationFt,
  depthFt: e.depthFt,
  pounds: e.pounds,
  stopReason: e.stopReason,
  finalPressurePsi: e.finalPressurePsi,
  torqueFtLb: e.torqueFtLb,
  shaft: e.shaft,
  designLoadLb: e.designLoadLb,
  capacityAllowableLb: e.capacityAllowableLb,
  belowDesignLoad: e.belowDesignLoad,
  note: e.note,
  loggedAt: e.loggedAt,
  state: 'stored',
  refusal: null,
  photos: e.photoCount,
  photosWaiting,
});

/** The stored rows and those still waiting, newest first; a row is shown once even while both know it. */
export function mergeRows(log: InstallLogResponse | undefined, queued: readonly QueuedRow[]): LogRow[] {
  const photos = queued.filter((r): r is QueuedPhoto => r.type === 'photo');
  const waitingFor = (clientRowId: string, id: string | null) =>
    photos.filter((p) => p.entryClientRowId === clientRowId || (id !== null && p.installEntryId === id))
      .length;
  const stored = (log?.entries ?? []).map((e) => fromStored(e, waitingFor(e.clientRowId, e.id)));
  const known = new Set(stored.map((r) => r.clientRowId));
  const waiting = queued
    .filter((r): r is QueuedEntry => r.type === 'entry' && !known.has(r.clientRowId))
    .map((q) => fromQueued(q, waitingFor(q.clientRowId, null)));
  return [...waiting, ...stored].sort((a, b) =>
    a.loggedAt < b.loggedAt ? 1 : a.loggedAt > b.loggedAt ? -1 : 0,
  );
}

export interface NoteRow {
  clientRowId: string;
  workDate: string;
  note: string | null;
  crewSize: number | null;
  labourHours: string;
  state: 'stored' | 'waiting' | 'refused';
  writtenByName: string | null;
}

export function mergeNotes(log: InstallLogResponse | undefined, queued: readonly QueuedRow[]): NoteRow[] {
  const stored: NoteRow[] = (log?.dayNotes ?? []).map((n: DayNote) => ({
    clientRowId: n.clientRowId,
    workDate: n.workDate,
    note: n.note ?? null,
    crewSize: n.crewSize ?? null,
    labourHours: n.labourHours,
    state: 'stored',
    writtenByName: n.writtenByName,
  }));
  const known = new Set(stored.map((n) => n.clientRowId));
  const waiting: NoteRow[] = queued
    .filter((r): r is QueuedDayNote => r.type === 'dayNote' && !known.has(r.clientRowId))
    .map((q) => ({
      clientRowId: q.clientRowId,
      workDate: q.body.workDate,
      note: q.body.note ?? null,
      crewSize: q.body.crewSize ?? null,
      labourHours: q.body.labourHours,
      state: q.refused ? 'refused' : 'waiting',
      writtenByName: null,
    }));
  return [...waiting, ...stored].sort((a, b) =>
    a.workDate < b.workDate ? 1 : a.workDate > b.workDate ? -1 : 0,
  );
}

export interface RunningTotals {
  injectionPoints: number;
  pounds: string;
  pushPiers: number;
  helicalPiles: number;
  flagged: number;
  labourHours: string;
}

const add = (a: string, b: string | null) => {
  if (!b) return a;
  try {
    return money(a).plus(money(b)).toString();
  } catch {
    return a;
  }
};

/** Counts and sums over everything entered, sent or not (the screen says how many still wait). */
export function runningTotals(rows: LogRow[], notes: NoteRow[]): RunningTotals {
  const t: RunningTotals = {
    injectionPoints: 0,
    pounds: '0',
    pushPiers: 0,
    helicalPiles: 0,
    flagged: 0,
    labourHours: '0',
  };
  for (const r of rows) {
    if (r.kind === 'injection') {
      t.injectionPoints += 1;
      t.pounds = add(t.pounds, r.pounds);
    } else if (r.kind === 'push_pier') t.pushPiers += 1;
    else t.helicalPiles += 1;
    if (r.belowDesignLoad) t.flagged += 1;
  }
  for (const n of notes) t.labourHours = add(t.labourHours, n.labourHours);
  return t;
}

/** The next number for a kind: one past the highest entered (points and piers are numbered on the plan). */
export function nextNumber(rows: LogRow[], kind: InstallKind): number {
  return rows.filter((r) => r.kind === kind).reduce((max, r) => Math.max(max, r.number), 0) + 1;
}
