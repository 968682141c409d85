import { Body, Controller, Get, HttpCode, Param, ParseUUIDPipe, Post, Query, Res } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiProduces, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import type { AccountLedger, JournalEntry, JournalPage, LedgerAccount, TrialBalance } from '@loambook/common';
import { Can, CurrentUser } from '../common/decorators';
import type { SessionUser } from '../auth/session-user';
import {
  AccountLinesQueryDto,
  AccountsQueryDto,
  JournalQueryDto,
  ReverseEntryDto,
  TrialBalanceQueryDto,
} from './dto/ledger.dto';
import { LedgerService, type Csv } from './ledger.service';

function sendCsv(res: Response, csv: Csv): string {
  res.setHeader('Content-Type', 'text/csv; charset=utf-8');
  res.setHeader('Content-Disposition', `attachment; filename="${csv.filename}"`);
  return csv.body;
}

/** The bookkeeper's ledger. `?format=csv` answers the same question as a CSV file. */
@ApiTags('ledger')
@ApiBearerAuth()
@Controller('ledger')
export class LedgerController {
  constructor(private readonly ledger: LedgerService) {}

  @Get('journal')
  @Can('read', 'JournalEntry')
  @ApiProduces('application/json', 'text/csv')
  @ApiOperation({ summary: 'Journal entries with their lines, newest first (CSV: every line, oldest first)' })
  async journal(
    @CurrentUser() user: SessionUser,
    @Query() q: JournalQueryDto,
    @Res({ passthrough: true }) res: Response,
  ): Promise<JournalPage | string> {
    const { format, page, pageSize, ...filter } = q;
    if (format === 'csv') return sendCsv(res, await this.ledger.journalCsv(user, filter));
    return this.ledger.journal(user, { ...filter, page, pageSize });
  }

  @Get('entries/:id')
  @Can('read', 'JournalEntry')
  entry(@CurrentUser() user: SessionUser, @Param('id', ParseUUIDPipe) id: string): Promise<JournalEntry> {
    return this.ledger.entry(user, id);
  }

  @Post('entries/:id/reverse')
  @HttpCode(201)
  @Can('create', 'JournalEntry')
  @ApiOperation({ summary: 'Post the entry that undoes this one (every line on the other side), naming it' })
  reverse(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: ReverseEntryDto,
  ): Promise<JournalEntry> {
    return this.ledger.reverse(id, user, dto.reason);
  }

  @Get('accounts')
  @Can('read', 'JournalEntry')
  accounts(@CurrentUser() user: SessionUser, @Query() q: AccountsQueryDto): Promise<LedgerAccount[]> {
    return this.ledger.accounts(user, q.branchId);
  }

  @Get('accounts/:id/lines')
  @Can('read', 'JournalEntry')
  @ApiProduces('application/json', 'text/csv')
  @ApiOperation({ summary: "An account's lines in date order with the running balance" })
  async accountLines(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Query() q: AccountLinesQueryDto,
    @Res({ passthrough: true }) res: Response,
  ): Promise<AccountLedger | string> {
    const { format, ...rest } = q;
    if (format === 'csv') return sendCsv(res, await this.ledger.accountLedgerCsv(user, id, rest));
    return this.ledger.accountLedger(user, id, rest);
  }

  @Get('trial-balance')
  @Can('read', 'JournalEntry')
  @ApiProduces('application/json', 'text/csv')
  @ApiOperation({
    summary: 'Debit and credit totals and balances per account up to a date; the columns agree',
  })
  async trialBalance(
    @CurrentUser() user: SessionUser,
    @Query() q: TrialBalanceQueryDto,
    @Res({ passthrough: true }) res: Response,
  ): Promise<TrialBalance | string> {
    const { format, ...rest } = q;
    if (format === 'csv') return sendCsv(res, await this.ledger.trialBalanceCsv(user, rest));
    return this.ledger.trialBalance(user, rest);
  }
}
