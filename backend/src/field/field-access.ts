import { Injectable } from '@nestjs/common';
import { ForbiddenError } from '@casl/ability';
import { asSubject } from '@loambook/common';
import type { SessionUser } from '../auth/session-user';
import { conflict, notFound } from '../common/domain-error';
import type { Db } from '../database/transaction';
import { JobsRepository, jobSubject, type JobRecord } from '../jobs/jobs.repository';

/**
 * The job behind a field route, checked for the signed-in user: outside their reach → 404 (never 403);
 * readable but not theirs to change → 403.
 */
@Injectable()
export class FieldAccess {
  constructor(private readonly jobs: JobsRepository) {}

  async readable(user: SessionUser, jobId: string, db?: Db, forUpdate = false): Promise<JobRecord> {
    const job = await this.jobs.findForUser(user, jobId, { action: 'read', db, forUpdate });
    if (!job) throw notFound('job');
    return job;
  }

  async writable(user: SessionUser, jobId: string, db?: Db, forUpdate = false): Promise<JobRecord> {
    const job = await this.readable(user, jobId, db, forUpdate);
    ForbiddenError.from(user.ability).throwUnlessCan('update', jobSubject(job));
    return job;
  }

  /**
   * Money figures (costs, margins) are the office's: readable by whoever may read the job's contract
   * (the manager, the owner, the bookkeeper, the job's own salesperson), not by the crew lead.
   */
  async moneyReadable(user: SessionUser, jobId: string): Promise<JobRecord> {
    const job = await this.readable(user, jobId);
    ForbiddenError.from(user.ability).throwUnlessCan(
      'read',
      asSubject('Contract', { branchId: job.branchId, salespersonId: job.salespersonId }),
    );
    return job;
  }
}

/** The crew writes to the log only while the job is in progress. */
export function requireInProgress(status: string): void {
  if (status === 'in_progress') return;
  if (status === 'completed') {
    throw conflict('JOB.ALREADY_COMPLETED', 'This job is completed: its log takes no more rows.');
  }
  if (status === 'cancelled') throw conflict('JOB.CANCELLED', 'This job is cancelled.');
  throw conflict('JOB.NOT_STARTED', 'This job has not started yet: start it before logging work on it.');
}
