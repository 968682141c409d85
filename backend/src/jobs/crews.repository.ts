import { Inject, Injectable } from '@nestjs/common';
import type { Knex } from 'knex';
import type { Crew, CrewMember } from '@loambook/common';
import { KNEX } from '../database/database.module';
import type { Db } from '../database/transaction';

export interface CrewRow {
  id: string;
  branchId: string;
  name: string;
  leadUserId: string;
  leadName: string;
  active: boolean;
}

/** Crews and their members: the only file of crews that touches Knex. */
@Injectable()
export class CrewsRepository {
  constructor(@Inject(KNEX) private readonly knex: Knex) {}

  private base(db: Db) {
    return db('crews as c')
      .join('users as u', 'u.id', 'c.lead_user_id')
      .select(
        'c.id',
        'c.branch_id as branchId',
        'c.name',
        'c.lead_user_id as leadUserId',
        'u.name as leadName',
        'c.active',
      );
  }

  async find(id: string, db: Db = this.knex, forUpdate = false): Promise<CrewRow | undefined> {
    const q = this.base(db).where('c.id', id).first();
    if (forUpdate) q.forUpdate('c');
    return q;
  }

  /** Crews of the branches (null: every branch), by branch then name, with their members. */
  async list(branchIds: string[] | null, branchId: string | undefined, db: Db = this.knex): Promise<Crew[]> {
    const q = this.base(db).orderBy([{ column: 'c.branch_id' }, { column: 'c.name' }]);
    if (branchIds) q.whereIn('c.branch_id', branchIds);
    if (branchId) q.where('c.branch_id', branchId);
    const rows: CrewRow[] = await q;
    const members = await this.members(
      rows.map((r) => r.id),
      db,
    );
    return rows.map((r) => ({ ...r, members: members.get(r.id) ?? [] }));
  }

  async members(crewIds: string[], db: Db = this.knex): Promise<Map<string, CrewMember[]>> {
    const out = new Map<string, CrewMember[]>();
    if (!crewIds.length) return out;
    const rows: { crewId: string; id: string; name: string; phone: string | null }[] = await db(
      'crew_members',
    )
      .whereIn('crew_id', crewIds)
      .orderBy([{ column: 'crew_id' }, { column: 'position' }])
      .select('crew_id as crewId', 'id', 'name', 'phone');
    for (const r of rows) {
      const list = out.get(r.crewId) ?? [];
      list.push({ id: r.id, name: r.name, phone: r.phone });
      out.set(r.crewId, list);
    }
    return out;
  }

  async insert(
    c: { branchId: string; name: string; leadUserId: string; active: boolean },
    db: Db,
  ): Promise<string> {
    const [row] = await db('crews')
      .insert({ branch_id: c.branchId, name: c.name, lead_user_id: c.leadUserId, active: c.active })
      .returning('id');
    return row.id;
  }

  async update(
    id: string,
    patch: { name?: string; leadUserId?: string; active?: boolean },
    db: Db,
  ): Promise<void> {
    const row: Record<string, unknown> = { updated_at: db.fn.now() };
    if (patch.name !== undefined) row.name = patch.name;
    if (patch.leadUserId !== undefined) row.lead_user_id = patch.leadUserId;
    if (patch.active !== undefined) row.active = patch.active;
    await db('crews').where({ id }).update(row);
  }

  async replaceMembers(crewId: string, branchId: string, members: CrewMember[], db: Db): Promise<void> {
    await db('crew_members').where({ crew_id: crewId }).delete();
    if (!members.length) return;
    await db('crew_members').insert(
      members.map((m, position) => ({
        crew_id: crewId,
        branch_id: branchId,
        name: m.name,
        phone: m.phone ?? null,
        position,
      })),
    );
  }

  /** A crew's new lead takes over its jobs still to do (the crew lead's permission reads jobs.crew_lead_id). */
  async handJobsToLead(crewId: string, leadUserId: string, db: Db): Promise<void> {
    await db('jobs')
      .where({ crew_id: crewId })
      .whereIn('status', ['scheduled', 'in_progress'])
      .update({ crew_lead_id: leadUserId, updated_at: db.fn.now() });
  }

  /** An active crew lead assigned to the branch. */
  async isCrewLeadOf(userId: string, branchId: string, db: Db = this.knex): Promise<boolean> {
    const row = await db('users as u')
      .join('user_branches as ub', 'ub.user_id', 'u.id')
      .where({ 'u.id': userId, 'ub.branch_id': branchId, 'u.active': true, 'u.role': 'crew_lead' })
      .first('u.id');
    return !!row;
  }
}
