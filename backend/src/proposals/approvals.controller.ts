import { Body, Controller, Get, HttpCode, Param, ParseUUIDPipe, Post, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { ApprovalRequestView } from '@loambook/common';
import { Can, CurrentUser } from '../common/decorators';
import type { SessionUser } from '../auth/session-user';
import { ApprovalsQueryDto, ApproveDto, RefuseDto } from './dto/proposal.dto';
import { ApprovalsService } from './approvals.service';

@ApiTags('approvals')
@ApiBearerAuth()
@Controller('approvals')
export class ApprovalsController {
  constructor(private readonly approvals: ApprovalsService) {}

  @Get()
  @Can('approve', 'Proposal')
  @ApiOperation({ summary: 'The approval queue: a manager’s branches, or every branch for the owner' })
  list(@CurrentUser() user: SessionUser, @Query() query: ApprovalsQueryDto): Promise<ApprovalRequestView[]> {
    return this.approvals.list(user, query.status ?? 'pending');
  }

  @Post(':id/approve')
  @HttpCode(200)
  @Can('approve', 'Proposal')
  approve(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: ApproveDto,
  ): Promise<ApprovalRequestView> {
    return this.approvals.decide(user, id, 'approved', dto.note?.trim() || null);
  }

  @Post(':id/refuse')
  @HttpCode(200)
  @Can('approve', 'Proposal')
  refuse(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: RefuseDto,
  ): Promise<ApprovalRequestView> {
    return this.approvals.decide(user, id, 'refused', dto.note.trim());
  }
}
