import { Inject, Injectable } from '@nestjs/common';
import { ForbiddenError } from '@casl/ability';
import type { Knex } from 'knex';
import {
  asSubject,
  branchScope,
  ROLE_LABELS,
  type InviteUserRequest,
  type Role,
  type UpdateUserRequest,
  type UserSummary,
} from '@loambook/common';
import { APP_CONFIG, type AppConfig } from '../config/config';
import { KNEX } from '../database/database.module';
import { inTransaction, type Db } from '../database/transaction';
import { conflict, DomainError, notFound } from '../common/domain-error';
import { AuthService } from '../auth/auth.service';
import type { SessionUser } from '../auth/session-user';
import { BranchesRepository } from '../branches/branches.repository';
import { MailService } from '../mail/mail.service';
import { invitationMail } from '../mail/templates';
import { UsersRepository } from './users.repository';

/** Roles that work inside branches and so need at least one. The owner and bookkeeper see every branch. */
const BRANCH_ROLES: readonly Role[] = ['branch_manager', 'salesperson', 'crew_lead'];

const fieldError = (code: string, field: string, message: string) =>
  new DomainError(code.startsWith('VALIDATION') ? 'invalid' : 'conflict', code, message, [
    { field, message },
  ]);

@Injectable()
export class UsersService {
  constructor(
    private readonly repo: UsersRepository,
    private readonly branches: BranchesRepository,
    private readonly auth: AuthService,
    private readonly mail: MailService,
    @Inject(KNEX) private readonly knex: Knex,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
  ) {}

  async list(user: SessionUser, filter: { branchId?: string }): Promise<UserSummary[]> {
    if (user.role !== 'owner' && user.role !== 'branch_manager') {
      return (await this.repo.list(null, {})).filter((u) => u.id === user.id);
    }
    return this.repo.list(branchScope(user, 'admin'), filter);
  }

  async get(user: SessionUser, id: string, db: Db = this.knex): Promise<UserSummary> {
    const target = await this.repo.findById(id, db);
    // Someone outside the reader's branches answers 404: their existence does not leak.
    if (!target || !user.ability.can('read', asSubject('User', target))) throw notFound('user');
    return target;
  }

  async invite(user: SessionUser, input: InviteUserRequest): Promise<UserSummary> {
    ForbiddenError.from(user.ability)
      .setMessage('Your role cannot invite someone with that role.')
      .throwUnlessCan('create', asSubject('User', { id: '', role: input.role, branchIds: input.branchIds }));
    return inTransaction(this.knex, async (trx) => {
      await this.checkBranches(user, input.role, input.branchIds, trx);
      if (await this.repo.emailTaken(input.email, trx)) {
        throw fieldError('USER.EMAIL_TAKEN', 'email', 'Someone already has an account with this e-mail.');
      }
      const id = await this.repo.insert({ ...input, invitedBy: user.id }, trx);
      await this.repo.setBranches(id, input.branchIds, trx);
      await this.sendInvitation(user, { id, name: input.name, email: input.email, role: input.role }, trx);
      return (await this.repo.findById(id, trx))!;
    });
  }

  async resendInvitation(user: SessionUser, id: string): Promise<UserSummary> {
    return inTransaction(this.knex, async (trx) => {
      const target = await this.get(user, id, trx);
      ForbiddenError.from(user.ability).throwUnlessCan('update', asSubject('User', target));
      if (!target.invitationPending) {
        throw conflict('USER.ALREADY_ACTIVE', 'This person has already set a password.');
      }
      if (!target.active)
        throw conflict('USER.INACTIVE', 'Reactivate this person before inviting them again.');
      await this.sendInvitation(user, target, trx);
      return target;
    });
  }

  async update(user: SessionUser, id: string, patch: UpdateUserRequest): Promise<UserSummary> {
    return inTransaction(this.knex, async (trx) => {
      const target = await this.get(user, id, trx);
      const ability = ForbiddenError.from(user.ability).setMessage('Your role cannot change this person.');
      ability.throwUnlessCan('update', asSubject('User', target));
      const role = patch.role ?? target.role;
      if (patch.role && patch.role !== target.role) {
        ability.throwUnlessCan('update', asSubject('User', { ...target, role: patch.role }));
        if (target.id === user.id) throw conflict('USER.OWN_ROLE', 'You cannot change your own role.');
      }
      if (patch.active === false && target.id === user.id) {
        throw conflict('USER.DEACTIVATE_SELF', 'You cannot deactivate your own account.');
      }
      const losesOwner =
        target.role === 'owner' && target.active && (patch.active === false || role !== 'owner');
      if (losesOwner && (await this.repo.countActiveOwners(trx)) <= 1) {
        throw conflict('USER.LAST_OWNER', 'The company needs at least one active owner.');
      }
      let branchIds = target.branchIds;
      if (patch.branchIds) {
        branchIds = this.mergeBranches(user, target.branchIds, patch.branchIds);
      }
      if (patch.branchIds || patch.role) await this.checkBranches(user, role, branchIds, trx, false);
      await this.repo.update(id, { name: patch.name, role: patch.role, active: patch.active }, trx);
      if (patch.branchIds) await this.repo.setBranches(id, branchIds, trx);
      return (await this.repo.findById(id, trx))!;
    });
  }

  /**
   * A manager edits memberships only inside their own branches; the person's other memberships stay.
   * Naming a branch outside the manager's reach is refused as an unknown branch.
   */
  private mergeBranches(user: SessionUser, current: string[], requested: string[]): string[] {
    const scope = branchScope(user, 'admin');
    if (!scope) return requested;
    const outside = requested.filter((b) => !scope.includes(b));
    if (outside.length) throw fieldError('VALIDATION.FAILED', 'branchIds', 'Unknown branch.');
    return [...new Set([...current.filter((b) => !scope.includes(b)), ...requested])].sort();
  }

  private async checkBranches(user: SessionUser, role: Role, branchIds: string[], db: Db, ownOnly = true) {
    const existing = await this.branches.existingIds(branchIds, db);
    const scope = branchScope(user, 'admin');
    const unknown = branchIds.filter(
      (b) => !existing.includes(b) || (ownOnly && scope && !scope.includes(b)),
    );
    if (unknown.length) throw fieldError('VALIDATION.FAILED', 'branchIds', 'Unknown branch.');
    if (BRANCH_ROLES.includes(role) && branchIds.length === 0) {
      throw fieldError(
        'VALIDATION.FAILED',
        'branchIds',
        `A ${ROLE_LABELS[role].toLowerCase()} needs at least one branch.`,
      );
    }
  }

  private async sendInvitation(
    inviter: SessionUser,
    target: { id: string; name: string; email: string; role: Role },
    db: Db,
  ): Promise<void> {
    const token = await this.auth.issuePasswordToken(target.id, 'invite', db);
    const mail = invitationMail({
      name: target.name,
      invitedBy: inviter.name,
      roleLabel: ROLE_LABELS[target.role].toLowerCase(),
      link: this.auth.passwordLink(token),
      hours: this.config.invitationTtlHours,
    });
    // Sent inside the transaction: if the mail server refuses, nothing is saved and the owner can retry.
    await this.mail.send({ to: target.email, ...mail });
  }
}
