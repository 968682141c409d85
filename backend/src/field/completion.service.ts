import { Inject, Injectable, Optional } from '@nestjs/common';
import type { Knex } from 'knex';
import {
  checkCompletionChecklist,
  checkResurvey,
  compareSurveys,
  COMPLETION_CHECKLIST_ITEMS,
  type CompletionChecklist,
  type SurveyComparison,
} from '@loambook/common';
import type { SessionUser } from '../auth/session-user';
import { DomainError } from '../common/domain-error';
import { KNEX } from '../database/database.module';
import { inTransaction } from '../database/transaction';
import { JobsRepository } from '../jobs/jobs.repository';
import { JobsService } from '../jobs/jobs.service';
import { Clock } from '../signing/clock';
import { readSignaturePng } from '../signing/signature';
import type { CompleteJobDto } from './dto/field.dto';
import { FieldAccess } from './field-access';
import { FieldRepository } from './field.repository';
import { JOB_COMPLETED_HANDLERS, type JobCompletedHandler } from './job-completed';

const label = (key: keyof CompletionChecklist) =>
  COMPLETION_CHECKLIST_ITEMS.find((i) => i.key === key)!.label.toLowerCase();

/**
 * Completing a job, in one transaction: the checklist, the re-survey, the homeowner's signature, the
 * job completed, the lead moved to completed, and every JOB_COMPLETED_HANDLERS handler told (issue #5
 * recognises the revenue and invoices the balance). Any failure rolls all of it back.
 */
@Injectable()
export class CompletionService {
  constructor(
    private readonly access: FieldAccess,
    private readonly repo: FieldRepository,
    private readonly jobsRepo: JobsRepository,
    private readonly jobs: JobsService,
    private readonly clock: Clock,
    @Inject(KNEX) private readonly knex: Knex,
    @Optional()
    @Inject(JOB_COMPLETED_HANDLERS)
    private readonly handlers: JobCompletedHandler[] | null = null,
  ) {}

  async complete(user: SessionUser, jobId: string, dto: CompleteJobDto, ip: string | null): Promise<void> {
    const job = await this.access.writable(user, jobId);
    completable(job.status);

    const checklist = checkCompletionChecklist(dto.checklist, dto.note);
    if (checklist.unanswered.length > 0) {
      throw new DomainError(
        'rule',
        'JOB.CHECKLIST_INCOMPLETE',
        `Answer every item of the checklist: ${checklist.unanswered.map(label).join('; ')}.`,
        checklist.errors,
      );
    }
    if (checklist.errors.length > 0) {
      throw new DomainError(
        'rule',
        'JOB.CHECKLIST_NOTE_REQUIRED',
        checklist.errors[0]!.message,
        checklist.errors,
      );
    }
    const surveyErrors = checkResurvey(dto.resurvey);
    if (surveyErrors.length > 0) {
      throw new DomainError(
        'rule',
        'JOB.RESURVEY_INVALID',
        surveyErrors.length === 1 ? surveyErrors[0]!.message : 'The re-survey needs attention.',
        surveyErrors,
      );
    }
    const png = await readSignaturePng(dto.signaturePng);
    const at = this.clock.now();

    await inTransaction(this.knex, async (trx) => {
      const locked = await this.jobsRepo.find(jobId, trx, true);
      completable(locked!.status);
      await this.repo.insertCompletion(
        {
          jobId,
          branchId: job.branchId,
          checklist: Object.fromEntries(
            COMPLETION_CHECKLIST_ITEMS.map((i) => [i.key, dto.checklist![i.key] === true]),
          ),
          homeownerName: dto.homeownerName,
          signaturePng: png,
          signedAt: at,
          signedIp: ip,
          completedBy: user.id,
          note: dto.note?.trim() || null,
          resurvey: dto.resurvey.map((p) => ({
            label: p.label,
            xFt: p.xFt,
            yFt: p.yFt,
            elevationIn: p.elevationIn,
            isReference: p.isReference === true,
          })),
        },
        trx,
      );
      await this.repo.markCompleted(jobId, at, trx);
      await this.jobs.advanceLead(job.leadId, user.id, trx);
      const event = {
        jobId,
        contractId: job.contractId,
        leadId: job.leadId,
        branchId: job.branchId,
        completedAt: at,
      };
      for (const handler of this.handlers ?? []) await handler.onJobCompleted(event, trx);
    });
  }

  /** The inspection's survey beside the re-survey (which exists once the job is completed). */
  async surveyComparison(user: SessionUser, jobId: string): Promise<SurveyComparison> {
    const job = await this.access.readable(user, jobId);
    const extras = await this.repo.extras(jobId);
    const [before, after] = await Promise.all([
      this.repo.inspectionSurvey(extras.inspectionId, job.leadId),
      this.repo.jobSurvey(jobId),
    ]);
    return compareSurveys(before, after);
  }
}

function completable(status: string): void {
  if (status === 'in_progress') return;
  if (status === 'completed') {
    throw new DomainError('conflict', 'JOB.ALREADY_COMPLETED', 'This job is already completed.');
  }
  if (status === 'cancelled') throw new DomainError('conflict', 'JOB.CANCELLED', 'This job is cancelled.');
  throw new DomainError(
    'conflict',
    'JOB.NOT_STARTED',
    'This job has not started: it cannot be completed yet.',
  );
}
