import { Inject, Injectable } from '@nestjs/common';
import { ForbiddenError } from '@casl/ability';
import type { Knex } from 'knex';
import {
  asSubject,
  branchScope,
  discountAuthorityProblem,
  isKnownTimezone,
  type Branch,
  type BranchInput,
} from '@loambook/common';
import { KNEX } from '../database/database.module';
import { inTransaction } from '../database/transaction';
import { conflict, DomainError, invalid, notFound } from '../common/domain-error';
import type { SessionUser } from '../auth/session-user';
import { BranchesRepository, type BranchDirectoryEntry } from './branches.repository';

@Injectable()
export class BranchesService {
  constructor(
    private readonly repo: BranchesRepository,
    @Inject(KNEX) private readonly knex: Knex,
  ) {}

  list(user: SessionUser): Promise<Branch[]> {
    // The bookkeeper works across branches, like the owner; everyone else sees their own.
    return this.repo.list(branchScope(user, 'sales'));
  }

  /**
   * Every branch, named only (id, code, name), for any signed-in person: a manager transferring a lead
   * must see where it can go, though the branches' settings stay behind GET /branches/:id.
   */
  directory(): Promise<BranchDirectoryEntry[]> {
    return this.repo.directory();
  }

  async get(user: SessionUser, id: string): Promise<Branch> {
    const branch = await this.repo.findById(id);
    // Another branch's record answers 404, not 403: its existence does not leak.
    if (!branch || !user.ability.can('read', asSubject('Branch', { id }))) throw notFound('branch');
    return branch;
  }

  async create(user: SessionUser, input: BranchInput): Promise<Branch> {
    ForbiddenError.from(user.ability).throwUnlessCan('create', 'Branch');
    this.checkRules(input);
    return inTransaction(this.knex, async (trx) => {
      if (await this.repo.findByCode(input.code, trx)) {
        throw new DomainError(
          'conflict',
          'BRANCH.CODE_TAKEN',
          `Another branch already uses the code ${input.code}.`,
          [{ field: 'code', message: 'This code is taken.' }],
        );
      }
      const id = await this.repo.insert(input, trx);
      return (await this.repo.findById(id, trx))!;
    });
  }

  async update(user: SessionUser, id: string, input: Partial<BranchInput>): Promise<Branch> {
    const current = await this.get(user, id);
    ForbiddenError.from(user.ability).throwUnlessCan('update', asSubject('Branch', { id }));
    this.checkRules({ ...current, ...input });
    return inTransaction(this.knex, async (trx) => {
      if (input.code && input.code !== current.code && (await this.repo.findByCode(input.code, trx))) {
        throw new DomainError(
          'conflict',
          'BRANCH.CODE_TAKEN',
          `Another branch already uses the code ${input.code}.`,
          [{ field: 'code', message: 'This code is taken.' }],
        );
      }
      await this.repo.update(id, input, trx);
      return (await this.repo.findById(id, trx))!;
    });
  }

  /** Only a branch nobody has used yet can go; after that it stays, for the records that name it. */
  async delete(user: SessionUser, id: string): Promise<void> {
    const branch = await this.get(user, id);
    ForbiddenError.from(user.ability).throwUnlessCan('delete', asSubject('Branch', { id }));
    if (branch.inUse) {
      throw conflict('BRANCH.IN_USE', 'This branch has people or records and cannot be deleted.', {
        userCount: branch.userCount,
      });
    }
    await this.repo.delete(id);
  }

  private checkRules(input: BranchInput): void {
    if (!isKnownTimezone(input.timezone)) throw invalid('timezone', 'Choose a time zone from the list.');
    const problem = discountAuthorityProblem(input.discountAuthority);
    if (problem) throw invalid('discountAuthority', problem);
  }
}
