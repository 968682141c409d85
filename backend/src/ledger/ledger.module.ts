import { Module } from '@nestjs/common';
import { LedgerController } from './ledger.controller';
import { LedgerRepository } from './ledger.repository';
import { LedgerService } from './ledger.service';

/**
 * The double-entry ledger (issue #5 §4). Payments and commissions post through LedgerService.post()
 * inside their own transactions.
 */
@Module({
  controllers: [LedgerController],
  providers: [LedgerRepository, LedgerService],
  exports: [LedgerService],
})
export class LedgerModule {}
