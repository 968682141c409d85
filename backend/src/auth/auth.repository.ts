import { Inject, Injectable } from '@nestjs/common';
import type { Knex } from 'knex';
import type { Role } from '@loambook/common';
import { KNEX } from '../database/database.module';
import type { Db } from '../database/transaction';

export interface UserCredentialsRow {
  id: string;
  name: string;
  email: string;
  role: Role;
  active: boolean;
  passwordHash: string | null;
  tokenVersion: number;
  branchIds: string[];
}

export interface PasswordTokenRow {
  id: string;
  userId: string;
  purpose: 'invite' | 'reset';
  expiresAt: Date;
  usedAt: Date | null;
}

/** What userQuery builds, for one id (the same columns; `limit 1` as `.first()` adds). */
const USER_BY_ID = `
  select u.id, u.name, u.email, u.role, u.active, u.password_hash as "passwordHash",
    u.token_version as "tokenVersion",
    coalesce((select array_agg(ub.branch_id order by ub.branch_id) from user_branches ub where ub.user_id = u.id), '{}') as "branchIds"
  from users as u where u.id = ? limit 1`;

/** The row the JWT strategy checks on every request: USER_BY_ID without the password hash, as pg takes it. */
const SESSION_ROW = `
  select u.id, u.name, u.email, u.role, u.active, u.token_version as "tokenVersion",
    coalesce((select array_agg(ub.branch_id order by ub.branch_id) from user_branches ub where ub.user_id = u.id), '{}') as "branchIds"
  from users as u where u.id = $1 limit 1`;

export type SessionRow = Omit<UserCredentialsRow, 'passwordHash'>;

/** A pooled pg connection as knex's client hands it out (acquireConnection / releaseConnection). */
interface PooledConnection {
  query(text: string, values: unknown[]): Promise<{ rows: SessionRow[] }>;
}
interface PoolingClient {
  acquireConnection(): Promise<PooledConnection>;
  releaseConnection(connection: PooledConnection): Promise<unknown>;
}

/** Reads and writes what sign-in needs: credentials, memberships, single-use password links. */
@Injectable()
export class AuthRepository {
  constructor(@Inject(KNEX) private readonly knex: Knex) {}

  private userQuery(db: Db) {
    return db('users as u')
      .select(
        'u.id',
        'u.name',
        'u.email',
        'u.role',
        'u.active',
        'u.password_hash as passwordHash',
        'u.token_version as tokenVersion',
        db.raw(
          `coalesce((select array_agg(ub.branch_id order by ub.branch_id) from user_branches ub where ub.user_id = u.id), '{}') as "branchIds"`,
        ),
      )
      .first();
  }

  findByEmail(email: string, db: Db = this.knex): Promise<UserCredentialsRow | undefined> {
    return this.userQuery(db).whereRaw('lower(u.email) = lower(?)', [email]);
  }

  /** The account with its password hash (sign-in, password links): written once, as userQuery builds it. */
  async findById(id: string, db: Db = this.knex): Promise<UserCredentialsRow | undefined> {
    const { rows } = await db.raw<{ rows: UserCredentialsRow[] }>(USER_BY_ID, [id]);
    return rows[0];
  }

  /**
   * The account behind a token, read on every request (AuthService.userForToken). The statement goes
   * straight to a connection of knex's own pool: knex's query runner (compiling, positioning bindings,
   * events) cost ~25 µs of each request for a statement that needs none of it.
   */
  async sessionRow(id: string): Promise<SessionRow | undefined> {
    const client = this.knex.client as PoolingClient;
    const connection = await client.acquireConnection();
    try {
      return (await connection.query(SESSION_ROW, [id])).rows[0];
    } finally {
      await client.releaseConnection(connection);
    }
  }

  /** The statement sessionRow sends, for the pipeline benchmark's baseline. */
  static sessionRowStatement(id: string): { sql: string; bindings: string[] } {
    return { sql: SESSION_ROW, bindings: [id] };
  }

  async recordSignIn(userId: string, db: Db = this.knex): Promise<void> {
    await db('users').where({ id: userId }).update({ last_sign_in_at: db.fn.now() });
  }

  async createPasswordToken(
    row: { userId: string; tokenHash: string; purpose: 'invite' | 'reset'; expiresAt: Date },
    db: Db = this.knex,
  ): Promise<void> {
    // A new link replaces any earlier unused one for the same person and purpose.
    await db('password_tokens')
      .where({ user_id: row.userId, purpose: row.purpose })
      .whereNull('used_at')
      .update({ used_at: db.fn.now(), superseded: true });
    await db('password_tokens').insert({
      user_id: row.userId,
      token_hash: row.tokenHash,
      purpose: row.purpose,
      expires_at: row.expiresAt,
    });
  }

  findPasswordToken(tokenHash: string, db: Db = this.knex): Promise<PasswordTokenRow | undefined> {
    return db('password_tokens')
      .select('id', 'user_id as userId', 'purpose', 'expires_at as expiresAt', 'used_at as usedAt')
      .where({ token_hash: tokenHash })
      .first();
  }

  /** Marks the link used; false when someone else used it first (a second click racing the first). */
  async consumePasswordToken(id: string, db: Db): Promise<boolean> {
    const n = await db('password_tokens').where({ id }).whereNull('used_at').update({ used_at: db.fn.now() });
    return n === 1;
  }

  async setPassword(userId: string, passwordHash: string, db: Db): Promise<void> {
    await db('users')
      .where({ id: userId })
      .update({
        password_hash: passwordHash,
        token_version: db.raw('token_version + 1'),
        updated_at: db.fn.now(),
      });
  }
}
