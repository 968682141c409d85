import { type MiddlewareConsumer, Module, type NestModule, RequestMethod } from '@nestjs/common';
import express, { type NextFunction, type Request, type Response } from 'express';
import type { ApiErrorBody } from '@loambook/common';
import { BankStatementsController } from './bank-statements.controller';
import { BankStatementsService } from './bank-statements.service';
import { BANK_CSV_MAX_BYTES } from './csv-file';
import { ReconciliationController } from './reconciliation.controller';
import { ReconciliationRepository } from './reconciliation.repository';
import { ReconciliationService } from './reconciliation.service';

const readText = express.text({ type: ['text/csv', 'text/plain'], limit: BANK_CSV_MAX_BYTES });

/** A CSV sent as the body of the preview (text/csv): read as text, a refusal answered in the API's shape. */
function csvBody(req: Request & { id?: string }, res: Response, next: NextFunction) {
  readText(req, res, (err?: unknown) => {
    if (!err) return next();
    const e = err as { status?: number; type?: string };
    const status = typeof e.status === 'number' ? e.status : 400;
    res.status(status).json({
      code: status === 413 ? 'UPLOAD.TOO_LARGE' : 'REQUEST.INVALID',
      message:
        status === 413
          ? `The file is larger than ${BANK_CSV_MAX_BYTES / (1024 * 1024)} MB. Upload a shorter period.`
          : 'The request could not be read.',
      details: null,
      requestId: String(req.id ?? ''),
    } satisfies ApiErrorBody);
  });
}

/**
 * Reconciliation (issue #5 §6): bank accounts, bank statement uploads with a column mapping remembered per
 * account, matching payouts and commission payments to bank lines, and locking reconciled periods.
 * Reads P1's processor_payouts / processor_payout_items and P2's commission_statements by SQL.
 */
@Module({
  controllers: [BankStatementsController, ReconciliationController],
  providers: [ReconciliationRepository, BankStatementsService, ReconciliationService],
})
export class ReconciliationModule implements NestModule {
  configure(consumer: MiddlewareConsumer): void {
    consumer.apply(csvBody).forRoutes({ path: 'bank-statements/preview', method: RequestMethod.POST });
  }
}
