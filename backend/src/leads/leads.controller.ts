import { Body, Controller, Get, HttpCode, Param, ParseUUIDPipe, Patch, Post, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type {
  CreateLeadResponse,
  DuplicateCheckResponse,
  LeadDetail,
  PipelineResponse,
} from '@loambook/common';
import { Can, CurrentUser } from '../common/decorators';
import type { SessionUser } from '../auth/session-user';
import {
  ChangeStageDto,
  CreateLeadDto,
  DuplicateCheckDto,
  LeadActivityDto,
  PipelineQueryDto,
  TransferLeadDto,
  UpdateLeadDto,
} from './dto/lead.dto';
import { LeadsService } from './leads.service';

@ApiTags('leads')
@ApiBearerAuth()
@Controller('leads')
export class LeadsController {
  constructor(private readonly leads: LeadsService) {}

  @Get()
  @Can('read', 'Lead')
  pipeline(@CurrentUser() user: SessionUser, @Query() query: PipelineQueryDto): Promise<PipelineResponse> {
    return this.leads.pipeline(user, query);
  }

  @Get('transferred-out')
  @Can('read', 'Lead')
  transferredOut(@CurrentUser() user: SessionUser) {
    return this.leads.transferredOut(user);
  }

  @Post()
  @Can('create', 'Lead')
  create(@CurrentUser() user: SessionUser, @Body() dto: CreateLeadDto): Promise<CreateLeadResponse> {
    return this.leads.create(user, dto);
  }

  @Post('duplicate-check')
  @HttpCode(200)
  @Can('read', 'Lead')
  duplicates(
    @CurrentUser() user: SessionUser,
    @Body() dto: DuplicateCheckDto,
  ): Promise<DuplicateCheckResponse> {
    return this.leads.duplicates(user, dto);
  }

  @Get(':id')
  @Can('read', 'Lead')
  get(@CurrentUser() user: SessionUser, @Param('id', ParseUUIDPipe) id: string): Promise<LeadDetail> {
    return this.leads.get(user, id);
  }

  @Patch(':id')
  @Can('update', 'Lead')
  update(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: UpdateLeadDto,
  ): Promise<LeadDetail> {
    return this.leads.update(user, id, dto);
  }

  @Post(':id/activities')
  @Can('update', 'Lead')
  addActivity(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: LeadActivityDto,
  ): Promise<LeadDetail> {
    return this.leads.addActivity(user, id, dto);
  }

  @Post(':id/stage')
  @HttpCode(200)
  @Can('update', 'Lead')
  changeStage(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: ChangeStageDto,
  ): Promise<LeadDetail> {
    return this.leads.changeStage(user, id, dto);
  }

  @Post(':id/transfer')
  @HttpCode(200)
  @Can('update', 'Lead')
  transfer(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: TransferLeadDto,
  ): Promise<LeadDetail> {
    return this.leads.transfer(user, id, dto);
  }
}
