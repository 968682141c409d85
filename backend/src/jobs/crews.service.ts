import { Inject, Injectable } from '@nestjs/common';
import type { Knex } from 'knex';
import { asSubject, branchScope, type Crew } from '@loambook/common';
import type { SessionUser } from '../auth/session-user';
import { conflict, invalid, notFound } from '../common/domain-error';
import { KNEX } from '../database/database.module';
import { inTransaction } from '../database/transaction';
import { CrewsRepository } from './crews.repository';
import type { CrewDto, UpdateCrewDto } from './dto/jobs.dto';

/** A branch's jobs are managed by its manager (and the owner): so are its crews. */
const manages = (user: SessionUser, branchId: string) =>
  user.ability.can('manage', asSubject('Job', { branchId, salespersonId: null, crewLeadId: null }));

const nameTaken = (e: unknown) => (e as { code?: string; constraint?: string }).code === '23505';

/** Crews of a branch: a crew lead (a user with the crew_lead role in the branch) and the people with them. */
@Injectable()
export class CrewsService {
  constructor(
    private readonly repo: CrewsRepository,
    @Inject(KNEX) private readonly knex: Knex,
  ) {}

  /** The crews of the user's branches (a crew lead sees the crews of their branches, for the calendar). */
  async list(user: SessionUser, branchId?: string): Promise<Crew[]> {
    return this.repo.list(branchScope(user, 'sales'), branchId);
  }

  async create(user: SessionUser, dto: CrewDto): Promise<Crew> {
    if (!manages(user, dto.branchId)) throw notFound('branch');
    const id = await inTransaction(this.knex, async (trx) => {
      await this.checkLead(dto.leadUserId, dto.branchId, trx);
      let crewId: string;
      try {
        crewId = await this.repo.insert(
          { branchId: dto.branchId, name: dto.name, leadUserId: dto.leadUserId, active: dto.active ?? true },
          trx,
        );
      } catch (e) {
        if (nameTaken(e)) throw this.taken(dto.name);
        throw e;
      }
      await this.repo.replaceMembers(crewId, dto.branchId, dto.members, trx);
      return crewId;
    });
    return this.get(id);
  }

  async update(user: SessionUser, id: string, dto: UpdateCrewDto): Promise<Crew> {
    await inTransaction(this.knex, async (trx) => {
      const crew = await this.repo.find(id, trx, true);
      if (!crew || !manages(user, crew.branchId)) throw notFound('crew');
      if (dto.branchId !== undefined && dto.branchId !== crew.branchId) {
        throw invalid('branchId', 'A crew stays in its branch: make a new crew in the other branch.');
      }
      if (dto.leadUserId !== undefined && dto.leadUserId !== crew.leadUserId) {
        await this.checkLead(dto.leadUserId, crew.branchId, trx);
      }
      try {
        await this.repo.update(id, { name: dto.name, leadUserId: dto.leadUserId, active: dto.active }, trx);
      } catch (e) {
        if (nameTaken(e)) throw this.taken(dto.name ?? crew.name);
        throw e;
      }
      if (dto.leadUserId !== undefined && dto.leadUserId !== crew.leadUserId) {
        await this.repo.handJobsToLead(id, dto.leadUserId, trx);
      }
      if (dto.members !== undefined) await this.repo.replaceMembers(id, crew.branchId, dto.members, trx);
    });
    return this.get(id);
  }

  private async get(id: string): Promise<Crew> {
    const crew = (await this.repo.find(id))!;
    const members = await this.repo.members([id]);
    return { ...crew, members: members.get(id) ?? [] };
  }

  private async checkLead(userId: string, branchId: string, db: Knex.Transaction): Promise<void> {
    if (!(await this.repo.isCrewLeadOf(userId, branchId, db))) {
      throw invalid('leadUserId', 'Choose an active crew lead of this branch.');
    }
  }

  private taken(name: string) {
    return conflict('CREW.NAME_TAKEN', `The branch already has a crew named "${name}".`);
  }
}
