import { Body, Controller, Get, HttpCode, Param, ParseUUIDPipe, Post, Put } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { ProposalDetail, ProposalSummary } from '@loambook/common';
import { Can, CurrentUser } from '../common/decorators';
import type { SessionUser } from '../auth/session-user';
import { CreateProposalDto, UpdateProposalDto } from './dto/proposal.dto';
import { ProposalsService } from './proposals.service';

@ApiTags('proposals')
@ApiBearerAuth()
@Controller()
export class ProposalsController {
  constructor(private readonly proposals: ProposalsService) {}

  @Post('leads/:leadId/proposals')
  @Can('create', 'Proposal')
  @ApiOperation({
    summary: 'Draft a proposal (version 1, or the next after a declined one) from the price book',
  })
  create(
    @CurrentUser() user: SessionUser,
    @Param('leadId', ParseUUIDPipe) leadId: string,
    @Body() dto: CreateProposalDto,
  ): Promise<ProposalDetail> {
    return this.proposals.create(user, leadId, dto);
  }

  @Get('leads/:leadId/proposals')
  @Can('read', 'Proposal')
  list(
    @CurrentUser() user: SessionUser,
    @Param('leadId', ParseUUIDPipe) leadId: string,
  ): Promise<ProposalSummary[]> {
    return this.proposals.listForLead(user, leadId);
  }

  @Get('proposals/:id')
  @Can('read', 'Proposal')
  get(@CurrentUser() user: SessionUser, @Param('id', ParseUUIDPipe) id: string): Promise<ProposalDetail> {
    return this.proposals.get(user, id);
  }

  @Put('proposals/:id')
  @Can('update', 'Proposal')
  @ApiOperation({
    summary:
      'Replace the options: in place for a draft/refused/approved version; a sent one gets a new version',
  })
  update(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: UpdateProposalDto,
  ): Promise<ProposalDetail> {
    return this.proposals.update(user, id, dto);
  }

  @Post('proposals/:id/submit')
  @HttpCode(200)
  @Can('update', 'Proposal')
  @ApiOperation({ summary: 'Within floor and authority → approved; otherwise an approval request is queued' })
  submit(@CurrentUser() user: SessionUser, @Param('id', ParseUUIDPipe) id: string): Promise<ProposalDetail> {
    return this.proposals.submit(user, id);
  }
}
