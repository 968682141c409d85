import { createHash, randomBytes } from 'node:crypto';
import { Inject, Injectable } from '@nestjs/common';
import { JwtService } from '@nestjs/jwt';
import type { Knex } from 'knex';
import {
  defineAbilityFor,
  defineRulesFor,
  passwordProblem,
  type AuthUser,
  type MeResponse,
  type PasswordTokenInfo,
  type SessionResponse,
} from '@loambook/common';
import { APP_CONFIG, type AppConfig } from '../config/config';
import { KNEX } from '../database/database.module';
import { inTransaction, type Db } from '../database/transaction';
import { DomainError } from '../common/domain-error';
import { AuthRepository, type SessionRow, type UserCredentialsRow } from './auth.repository';
import { burnPasswordCheck, hashPassword, verifyPassword } from './password-hash';
import type { SessionUser } from './session-user';

export interface TokenPayload {
  sub: string;
  /** token_version at issue; bumped by deactivation and password changes, which ends older tokens. */
  tv: number;
}

const INVALID_CREDENTIALS = () =>
  new DomainError(
    'unauthorized',
    'AUTH.INVALID_CREDENTIALS',
    'That e-mail and password do not match an active account.',
  );

/** Enough for every signed-in person of a large contractor; past it the cache simply starts again. */
const SESSION_CACHE_SIZE = 2000;

const sha256 = (token: string) => createHash('sha256').update(token).digest('hex');

@Injectable()
export class AuthService {
  /** Session users by everything they are built from; CASL abilities are not changed once built. */
  private readonly sessions = new Map<string, SessionUser>();

  constructor(
    private readonly repo: AuthRepository,
    private readonly jwt: JwtService,
    @Inject(KNEX) private readonly knex: Knex,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
  ) {}

  async login(email: string, password: string): Promise<SessionResponse> {
    const row = await this.repo.findByEmail(email.trim());
    if (!row || !row.passwordHash) {
      await burnPasswordCheck(password);
      throw INVALID_CREDENTIALS();
    }
    const ok = await verifyPassword(password, row.passwordHash);
    // An inactive account gets the same answer as a wrong password: nothing about the account leaks.
    if (!ok || !row.active) throw INVALID_CREDENTIALS();
    await this.repo.recordSignIn(row.id);
    return this.session(row);
  }

  /**
   * Called by the JWT strategy on every request: the token must still match an active account, so the
   * account is read every time (a deactivation or a new role applies to the very next request). What is
   * built from the row — the session user and its CASL ability — is reused while the row says the same.
   */
  async userForToken(payload: TokenPayload): Promise<SessionUser | null> {
    const row = await this.repo.sessionRow(payload.sub);
    if (!row || !row.active || row.tokenVersion !== payload.tv) return null;
    const key = `${row.id}|${row.tokenVersion}|${row.role}|${row.name}|${row.email}|${row.branchIds.join(',')}`;
    const known = this.sessions.get(key);
    if (known) return known;
    const user = toAuthUser(row);
    // Shared by concurrent requests: frozen, so no handler can change another request's user.
    const session: SessionUser = Object.freeze({
      ...user,
      branchIds: Object.freeze([...user.branchIds]) as string[],
      ability: defineAbilityFor(user),
    });
    if (this.sessions.size >= SESSION_CACHE_SIZE) this.sessions.clear();
    this.sessions.set(key, session);
    return session;
  }

  me(user: SessionUser): MeResponse {
    const { ability: _ability, ...plain } = user;
    return { user: plain, rules: defineRulesFor(plain) };
  }

  /** Creates a single-use link to set a password; returns the raw token (only its hash is stored). */
  async issuePasswordToken(userId: string, purpose: 'invite' | 'reset', db: Db = this.knex): Promise<string> {
    const token = randomBytes(32).toString('base64url');
    const expiresAt = new Date(Date.now() + this.config.invitationTtlHours * 3600 * 1000);
    await this.repo.createPasswordToken({ userId, tokenHash: sha256(token), purpose, expiresAt }, db);
    return token;
  }

  passwordLink(token: string): string {
    return `${this.config.publicUrl}/set-password?token=${encodeURIComponent(token)}`;
  }

  async passwordTokenInfo(token: string): Promise<PasswordTokenInfo> {
    const { row, user } = await this.usableToken(token, this.knex);
    return {
      email: user.email,
      name: user.name,
      purpose: row.purpose,
      expiresAt: row.expiresAt.toISOString(),
    };
  }

  async setPassword(token: string, password: string): Promise<SessionResponse> {
    return inTransaction(this.knex, async (trx) => {
      const { row, user } = await this.usableToken(token, trx);
      const problem = passwordProblem(password, { email: user.email });
      if (problem) {
        throw new DomainError('invalid', 'VALIDATION.FAILED', problem, [
          { field: 'password', message: problem },
        ]);
      }
      if (!(await this.repo.consumePasswordToken(row.id, trx))) throw linkUnusable('AUTH.LINK_USED');
      await this.repo.setPassword(user.id, await hashPassword(password), trx);
      const fresh = await this.repo.findById(user.id, trx);
      return this.session(fresh!);
    });
  }

  private async usableToken(token: string, db: Db) {
    const row = await this.repo.findPasswordToken(sha256(token), db);
    if (!row) throw linkUnusable('AUTH.LINK_UNKNOWN');
    if (row.usedAt) throw linkUnusable('AUTH.LINK_USED');
    if (row.expiresAt.getTime() <= Date.now()) throw linkUnusable('AUTH.LINK_EXPIRED');
    const user = await this.repo.findById(row.userId, db);
    if (!user || !user.active) throw linkUnusable('AUTH.LINK_UNKNOWN');
    return { row, user };
  }

  private session(row: UserCredentialsRow): SessionResponse {
    const user = toAuthUser(row);
    const payload: TokenPayload = { sub: row.id, tv: row.tokenVersion };
    const accessToken = this.jwt.sign(payload, { expiresIn: this.config.jwt.expiresInSeconds });
    const expiresAt = new Date(Date.now() + this.config.jwt.expiresInSeconds * 1000).toISOString();
    return { accessToken, expiresAt, user, rules: defineRulesFor(user) };
  }
}

const LINK_MESSAGES: Record<string, string> = {
  'AUTH.LINK_UNKNOWN': 'This link is not valid. Ask your manager to send a new invitation.',
  'AUTH.LINK_USED': 'This link has already been used. Sign in with your password, or ask for a new link.',
  'AUTH.LINK_EXPIRED': 'This link has expired. Ask your manager to send a new invitation.',
};

function linkUnusable(code: keyof typeof LINK_MESSAGES & string) {
  return new DomainError('gone', code, LINK_MESSAGES[code] ?? 'This link cannot be used.');
}

function toAuthUser(row: SessionRow): AuthUser {
  return { id: row.id, name: row.name, email: row.email, role: row.role, branchIds: row.branchIds };
}
