import { Inject, Injectable } from '@nestjs/common';
import { ForbiddenError } from '@casl/ability';
import type { Knex } from 'knex';
import {
  asSubject,
  type CreatePriceBookItemRequest,
  type PriceBookItem,
  type UpdatePriceBookItemRequest,
} from '@loambook/common';
import { KNEX } from '../database/database.module';
import { inTransaction } from '../database/transaction';
import { conflict, DomainError, notFound } from '../common/domain-error';
import type { SessionUser } from '../auth/session-user';
import { PriceBookRepository } from './price-book.repository';

const itemNotFound = () => notFound('price-book item', 'PRICE_BOOK.ITEM_NOT_FOUND');

const codeTaken = (code: string) =>
  new DomainError(
    'conflict',
    'PRICE_BOOK.CODE_TAKEN',
    `This branch's price book already has the code ${code}.`,
    [{ field: 'code', message: 'This code is taken in this branch.' }],
  );

/**
 * A branch's price book. Proposal lines keep a copy of the item (code, description, unit, cost, price)
 * as it was when the line was made, so changing or deactivating an item never changes a proposal.
 */
@Injectable()
export class PriceBookService {
  constructor(
    private readonly repo: PriceBookRepository,
    @Inject(KNEX) private readonly knex: Knex,
  ) {}

  async list(user: SessionUser, branchId: string, includeInactive: boolean): Promise<PriceBookItem[]> {
    await this.readableBranch(user, branchId);
    return this.repo.list(branchId, includeInactive);
  }

  async create(
    user: SessionUser,
    branchId: string,
    input: CreatePriceBookItemRequest,
  ): Promise<PriceBookItem> {
    await this.readableBranch(user, branchId);
    ForbiddenError.from(user.ability).throwUnlessCan('create', asSubject('PriceBook', { branchId }));
    return inTransaction(this.knex, async (trx) => {
      if (await this.repo.codeTaken(branchId, input.code, null, trx)) throw codeTaken(input.code);
      const id = await this.repo.insert(branchId, input, trx);
      return (await this.repo.findById(id, trx))!;
    });
  }

  async update(user: SessionUser, id: string, input: UpdatePriceBookItemRequest): Promise<PriceBookItem> {
    return inTransaction(this.knex, async (trx) => {
      const item = await this.readableItem(user, id, trx);
      ForbiddenError.from(user.ability).throwUnlessCan('update', asSubject('PriceBook', item));
      if (
        input.code &&
        input.code !== item.code &&
        (await this.repo.codeTaken(item.branchId, input.code, id, trx))
      ) {
        throw codeTaken(input.code);
      }
      await this.repo.update(id, input, trx);
      return (await this.repo.findById(id, trx))!;
    });
  }

  /** Only an item no proposal line names may go; one in use is deactivated instead (PATCH active:false). */
  async delete(user: SessionUser, id: string): Promise<void> {
    await inTransaction(this.knex, async (trx) => {
      const item = await this.readableItem(user, id, trx);
      ForbiddenError.from(user.ability).throwUnlessCan('delete', asSubject('PriceBook', item));
      if (item.inUse) {
        throw conflict(
          'PRICE_BOOK.ITEM_IN_USE',
          'A proposal uses this item, so it cannot be deleted. Deactivate it instead.',
        );
      }
      await this.repo.delete(id, trx);
    });
  }

  /** Another branch's price book answers 404, like any record out of reach. */
  private async readableBranch(user: SessionUser, branchId: string): Promise<void> {
    if (
      !user.ability.can('read', asSubject('PriceBook', { branchId })) ||
      !(await this.repo.branchExists(branchId))
    ) {
      throw notFound('branch');
    }
  }

  private async readableItem(user: SessionUser, id: string, db: Knex.Transaction): Promise<PriceBookItem> {
    const item = await this.repo.findById(id, db);
    if (!item || !user.ability.can('read', asSubject('PriceBook', item))) throw itemNotFound();
    return item;
  }
}
