import { Body, Controller, Get, HttpCode, Param, ParseUUIDPipe, Post, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import type {
  BuildStatementsResult,
  CommissionStatementDetail,
  CommissionStatementSummary,
  EarningRunResult,
} from '@loambook/common';
import { Can, CurrentUser } from '../common/decorators';
import type { SessionUser } from '../auth/session-user';
import { CommissionStatementsService } from './commission-statements.service';
import { CommissionsService } from './commissions.service';
import { BuildStatementsQueryDto, PayStatementDto, StatementsQueryDto } from './dto/commissions.dto';

/** Semi-monthly statements: the bookkeeper builds, approves and pays; others read what is theirs. */
@ApiTags('commissions')
@ApiBearerAuth()
@Controller('commission-statements')
export class CommissionStatementsController {
  constructor(private readonly statements: CommissionStatementsService) {}

  @Get()
  @Can('read', 'CommissionStatement')
  list(
    @CurrentUser() user: SessionUser,
    @Query() q: StatementsQueryDto,
  ): Promise<CommissionStatementSummary[]> {
    return this.statements.list(user, q);
  }

  @Post('build')
  @HttpCode(200)
  @Can('create', 'CommissionStatement')
  @ApiOperation({ summary: 'Put the lines dated up to the end of the pay period on draft statements' })
  build(
    @CurrentUser() user: SessionUser,
    @Query() q: BuildStatementsQueryDto,
  ): Promise<BuildStatementsResult> {
    return this.statements.build(user, q.period);
  }

  @Get(':id')
  @Can('read', 'CommissionStatement')
  get(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
  ): Promise<CommissionStatementDetail> {
    return this.statements.get(user, id);
  }

  @Post(':id/approve')
  @HttpCode(200)
  @Can('approve', 'CommissionStatement')
  approve(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
  ): Promise<CommissionStatementDetail> {
    return this.statements.approve(user, id);
  }

  @Post(':id/pay')
  @HttpCode(200)
  @Can('update', 'CommissionStatement')
  @ApiOperation({
    summary: 'Mark an approved statement paid: commissions payable / bank for the payable amount',
  })
  pay(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: PayStatementDto,
  ): Promise<CommissionStatementDetail> {
    return this.statements.pay(user, id, dto);
  }
}

/** The earning check on request (it also runs on its schedule). */
@ApiTags('commissions')
@ApiBearerAuth()
@Controller('commissions')
export class CommissionsController {
  constructor(private readonly commissions: CommissionsService) {}

  @Post('run')
  @HttpCode(200)
  @Can('create', 'CommissionStatement')
  @ApiOperation({ summary: 'Run the earning check now, as of the app clock' })
  run(): Promise<EarningRunResult> {
    return this.commissions.runEarning();
  }
}
