import { Module } from '@nestjs/common';
import { JobsModule } from '../jobs/jobs.module';
import { StorageModule } from '../storage/storage.module';
import { ActualsService } from './actuals.service';
import { CompletionService } from './completion.service';
import { FieldAccess } from './field-access';
import { FieldController } from './field.controller';
import { FieldRepository } from './field.repository';
import { InstallLogService } from './install-log.service';
import { JOB_COMPLETED_HANDLERS } from './job-completed';
import { WarrantyService } from './warranty.service';

/**
 * The field side of a job (issue #4): the crew's install log, day notes and photos, completion with the
 * re-survey and the homeowner's signature, actuals against the estimate, and the warranty.
 * JOB_COMPLETED_HANDLERS starts empty: issue #5 replaces this provider with its handlers (see
 * job-completed.ts).
 */
@Module({
  imports: [JobsModule, StorageModule],
  controllers: [FieldController],
  providers: [
    FieldRepository,
    FieldAccess,
    InstallLogService,
    CompletionService,
    ActualsService,
    WarrantyService,
    { provide: JOB_COMPLETED_HANDLERS, useValue: [] },
  ],
})
export class FieldModule {}
