import { Inject, Injectable } from '@nestjs/common';
import type { Knex } from 'knex';
import type { Role, UserSummary } from '@loambook/common';
import { KNEX } from '../database/database.module';
import type { Db } from '../database/transaction';

interface UserRow {
  id: string;
  name: string;
  email: string;
  role: Role;
  active: boolean;
  has_password: boolean;
  branch_ids: string[];
  last_sign_in_at: Date | null;
  created_at: Date;
}

const toSummary = (r: UserRow): UserSummary => ({
  id: r.id,
  name: r.name,
  email: r.email,
  role: r.role,
  active: r.active,
  branchIds: r.branch_ids,
  invitationPending: !r.has_password,
  lastSignInAt: r.last_sign_in_at?.toISOString() ?? null,
  createdAt: r.created_at.toISOString(),
});

@Injectable()
export class UsersRepository {
  constructor(@Inject(KNEX) private readonly knex: Knex) {}

  private base(db: Db) {
    return db('users as u').select(
      'u.id',
      'u.name',
      'u.email',
      'u.role',
      'u.active',
      'u.last_sign_in_at',
      'u.created_at',
      db.raw('u.password_hash is not null as has_password'),
      db.raw(
        `coalesce((select array_agg(ub.branch_id order by ub.branch_id) from user_branches ub where ub.user_id = u.id), '{}') as branch_ids`,
      ),
    );
  }

  /**
   * `scope` null: everyone. Otherwise people who belong to at least one of those branches — a manager's
   * view of their own branches' staff.
   */
  async list(
    scope: string[] | null,
    filter: { branchId?: string },
    db: Db = this.knex,
  ): Promise<UserSummary[]> {
    const q = this.base(db).orderBy('u.name');
    if (scope) {
      q.whereExists(db('user_branches as s').whereRaw('s.user_id = u.id').whereIn('s.branch_id', scope));
    }
    if (filter.branchId) {
      q.whereExists(
        db('user_branches as f').whereRaw('f.user_id = u.id').where('f.branch_id', filter.branchId),
      );
    }
    return (await q).map(toSummary);
  }

  async findById(id: string, db: Db = this.knex): Promise<UserSummary | undefined> {
    const row = await this.base(db).where('u.id', id).first();
    return row ? toSummary(row) : undefined;
  }

  async emailTaken(email: string, db: Db = this.knex): Promise<boolean> {
    return !!(await db('users').select('id').whereRaw('lower(email) = lower(?)', [email]).first());
  }

  async insert(
    u: { name: string; email: string; role: Role; invitedBy: string | null },
    db: Db,
  ): Promise<string> {
    const [row] = await db('users')
      .insert({ name: u.name, email: u.email, role: u.role, invited_by: u.invitedBy })
      .returning('id');
    return row.id;
  }

  async update(id: string, patch: { name?: string; role?: Role; active?: boolean }, db: Db): Promise<void> {
    const row: Record<string, unknown> = { updated_at: db.fn.now() };
    if (patch.name !== undefined) row.name = patch.name;
    if (patch.role !== undefined) row.role = patch.role;
    if (patch.active !== undefined) row.active = patch.active;
    // Changing someone's role or access ends their open sessions, so the new rules apply at once.
    if (patch.role !== undefined || patch.active !== undefined)
      row.token_version = db.raw('token_version + 1');
    await db('users').where({ id }).update(row);
  }

  async setBranches(userId: string, branchIds: string[], db: Db): Promise<void> {
    await db('user_branches').where({ user_id: userId }).delete();
    if (branchIds.length) {
      await db('user_branches').insert(branchIds.map((branch_id) => ({ user_id: userId, branch_id })));
    }
    await db('users')
      .where({ id: userId })
      .update({ token_version: db.raw('token_version + 1') });
  }

  async countActiveOwners(db: Db = this.knex): Promise<number> {
    const [{ n }] = await db('users').where({ role: 'owner', active: true }).count({ n: '*' });
    return Number(n);
  }
}
