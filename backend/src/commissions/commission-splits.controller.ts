import { Body, Controller, Get, Param, ParseUUIDPipe, Put } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { ContractCommissionSplitsView } from '@loambook/common';
import { Can, CurrentUser } from '../common/decorators';
import type { SessionUser } from '../auth/session-user';
import { CommissionSplitsService } from './commission-splits.service';
import { SetCommissionSplitsDto } from './dto/commissions.dto';

/** Who shares a contract's commission. */
@ApiTags('commissions')
@ApiBearerAuth()
@Controller('contracts')
export class CommissionSplitsController {
  constructor(private readonly splits: CommissionSplitsService) {}

  @Get(':id/commission-splits')
  @Can('read', 'Contract')
  @ApiOperation({ summary: 'The split (or the default, 100% to the salesperson), its plan and a preview' })
  get(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
  ): Promise<ContractCommissionSplitsView> {
    return this.splits.view(user, id);
  }

  @Put(':id/commission-splits')
  @Can('update', 'Contract')
  @ApiOperation({
    summary: 'Set the split (manager or owner; shares add up to 100) before anything is earned',
  })
  set(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: SetCommissionSplitsDto,
  ): Promise<ContractCommissionSplitsView> {
    return this.splits.set(user, id, dto);
  }
}
