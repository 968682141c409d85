import { Module } from '@nestjs/common';
import { LedgerModule } from '../ledger/ledger.module';
import { SigningModule } from '../signing/signing.module';
import { CommissionPlansController } from './commission-plans.controller';
import { CommissionPlansService } from './commission-plans.service';
import { CommissionSplitsController } from './commission-splits.controller';
import { CommissionSplitsService } from './commission-splits.service';
import { CommissionStatementsController, CommissionsController } from './commission-statements.controller';
import { CommissionStatementsService } from './commission-statements.service';
import { CommissionsRepository } from './commissions.repository';
import { CommissionsScheduler } from './commissions.scheduler';
import { CommissionsService } from './commissions.service';

/**
 * Commissions (issue #5 §5): plans, splits, the earning check (scheduled with pg-boss and on request),
 * and semi-monthly statements. Posts through LedgerService; reads "now" from the signing Clock.
 */
@Module({
  imports: [LedgerModule, SigningModule],
  controllers: [
    CommissionPlansController,
    CommissionSplitsController,
    CommissionStatementsController,
    CommissionsController,
  ],
  providers: [
    CommissionsRepository,
    CommissionPlansService,
    CommissionSplitsService,
    CommissionsService,
    CommissionStatementsService,
    CommissionsScheduler,
  ],
  exports: [CommissionsService, CommissionsScheduler],
})
export class CommissionsModule {}
