import { Body, Controller, Delete, Get, HttpCode, Param, ParseUUIDPipe, Post, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import type {
  MatchView,
  PayoutBreakdownView,
  ReconciledPeriod,
  ReconciliationView,
  SuggestResult,
} from '@loambook/common';
import { Can, CurrentUser } from '../common/decorators';
import type { SessionUser } from '../auth/session-user';
import {
  AccountQueryDto,
  CreateMatchDto,
  LockPeriodDto,
  RangeQueryDto,
  SuggestQueryDto,
} from './dto/reconciliation.dto';
import { ReconciliationService } from './reconciliation.service';

/** The reconciliation workspace: suggestions, matches, locking; and what a payout is made of. */
@ApiTags('reconciliation')
@ApiBearerAuth()
@Controller()
export class ReconciliationController {
  constructor(private readonly service: ReconciliationService) {}

  @Post('reconciliation/suggest')
  @HttpCode(200)
  @Can('update', 'Reconciliation')
  @ApiOperation({
    summary:
      'Match unmatched bank lines of the range to payouts and paid commission statements; store suggestions',
  })
  suggest(@CurrentUser() user: SessionUser, @Query() q: SuggestQueryDto): Promise<SuggestResult> {
    return this.service.suggest(user, q);
  }

  @Get('reconciliation')
  @Can('read', 'Reconciliation')
  @ApiOperation({ summary: 'Matched pairs and what is unmatched on both sides, for one account and range' })
  view(@CurrentUser() user: SessionUser, @Query() q: RangeQueryDto): Promise<ReconciliationView> {
    return this.service.view(user, q);
  }

  @Post('reconciliation/matches')
  @HttpCode(201)
  @Can('update', 'Reconciliation')
  @ApiOperation({ summary: 'Match a bank line by hand (confirmed at once)' })
  createMatch(@CurrentUser() user: SessionUser, @Body() dto: CreateMatchDto): Promise<MatchView> {
    return this.service.createMatch(user, dto);
  }

  @Post('reconciliation/matches/:id/confirm')
  @HttpCode(200)
  @Can('update', 'Reconciliation')
  confirm(@CurrentUser() user: SessionUser, @Param('id', ParseUUIDPipe) id: string): Promise<MatchView> {
    return this.service.confirm(user, id);
  }

  @Delete('reconciliation/matches/:id')
  @HttpCode(204)
  @Can('update', 'Reconciliation')
  @ApiOperation({
    summary: 'Undo a match; refused inside a locked period (409 RECONCILIATION.PERIOD_LOCKED)',
  })
  undo(@CurrentUser() user: SessionUser, @Param('id', ParseUUIDPipe) id: string): Promise<void> {
    return this.service.undo(user, id);
  }

  @Get('reconciliation/periods')
  @Can('read', 'Reconciliation')
  periods(@CurrentUser() user: SessionUser, @Query() q: AccountQueryDto): Promise<ReconciledPeriod[]> {
    return this.service.periods(user, q.bankAccountId);
  }

  @Post('reconciliation/lock')
  @HttpCode(201)
  @Can('update', 'Reconciliation')
  @ApiOperation({
    summary:
      'Lock a reconciled range of an account (409 RECONCILIATION.PERIOD_NOT_RECONCILED while anything is open)',
  })
  lock(@CurrentUser() user: SessionUser, @Body() dto: LockPeriodDto): Promise<ReconciledPeriod> {
    return this.service.lock(user, dto);
  }

  @Get('payouts/:id/breakdown')
  @Can('read', 'Reconciliation')
  @ApiOperation({
    summary: 'The charges, refunds and fees a processor payout is made of, and whether they add up',
  })
  breakdown(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
  ): Promise<PayoutBreakdownView> {
    return this.service.payoutBreakdown(user, id);
  }
}
