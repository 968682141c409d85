import { Global, Module } from '@nestjs/common';
import { LeadsModule } from '../leads/leads.module';
import { SigningModule } from '../signing/signing.module';
import { CrewsController } from './crews.controller';
import { CrewsRepository } from './crews.repository';
import { CrewsService } from './crews.service';
import { JobBoardService } from './job-board.service';
import { JobViews } from './job-views';
import { JobsController } from './jobs.controller';
import { JobsRepository } from './jobs.repository';
import { JobsService } from './jobs.service';

/**
 * Field jobs (issue #4): the job made from a signed contract, crews, scheduling, permit and 811
 * ticket, starting the work. Global, so that signing (which makes and cancels jobs) reaches
 * JobsService without importing this module back; it re-exports SigningModule for the Clock.
 */
@Global()
@Module({
  imports: [LeadsModule, SigningModule],
  controllers: [CrewsController, JobsController],
  providers: [JobsRepository, CrewsRepository, JobViews, JobsService, CrewsService, JobBoardService],
  exports: [JobsService, JobsRepository, JobViews, SigningModule],
})
export class JobsModule {}
