import { Module } from '@nestjs/common';
import { PriceBookModule } from '../price-book/price-book.module';
import { ApprovalsController } from './approvals.controller';
import { ApprovalsService } from './approvals.service';
import { ProposalsController } from './proposals.controller';
import { ProposalsRepository } from './proposals.repository';
import { ProposalsService } from './proposals.service';

@Module({
  imports: [PriceBookModule],
  controllers: [ProposalsController, ApprovalsController],
  providers: [ProposalsRepository, ProposalsService, ApprovalsService],
  // ProposalsService.markSent() is for the sending feature.
  exports: [ProposalsService, ProposalsRepository],
})
export class ProposalsModule {}
