import { Module } from '@nestjs/common';
import { LeadsModule } from '../leads/leads.module';
import { ProposalsModule } from '../proposals/proposals.module';
import { StorageModule } from '../storage/storage.module';
import { Clock } from './clock';
import { ContractsController } from './contracts.controller';
import { ContractsService } from './contracts.service';
import { ProposalSigningController } from './proposal-signing.controller';
import { SigningController } from './signing.controller';
import { SigningDocuments } from './signing-documents.service';
import { SigningRepository } from './signing.repository';
import { SigningService } from './signing.service';

/** Sending proposals, the homeowner's signing page, contracts and their cancellation (issue #3 §7–8). */
@Module({
  imports: [ProposalsModule, LeadsModule, StorageModule],
  controllers: [SigningController, ProposalSigningController, ContractsController],
  providers: [Clock, SigningRepository, SigningDocuments, SigningService, ContractsService],
  exports: [ContractsService, Clock],
})
export class SigningModule {}
