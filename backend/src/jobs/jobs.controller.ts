import {
  Body,
  Controller,
  Delete,
  Get,
  HttpCode,
  Param,
  ParseUUIDPipe,
  Post,
  Put,
  Query,
} from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { AtRiskJob, CalendarResponse, JobDetail, JobListResponse, JobSummary } from '@loambook/common';
import type { SessionUser } from '../auth/session-user';
import { Can, CurrentUser } from '../common/decorators';
import {
  BranchQueryDto,
  CalendarQueryDto,
  JobListQueryDto,
  LocateDto,
  PermitDto,
  ScheduleJobDto,
  WaiveWindowDto,
} from './dto/jobs.dto';
import { JobBoardService } from './job-board.service';

/**
 * Field jobs. The static paths come before /jobs/:id, and :id must be a uuid, so that other features'
 * paths under /jobs (the field log's /jobs/actuals/summary) are not taken for a job.
 */
@ApiTags('jobs')
@ApiBearerAuth()
@Controller('jobs')
export class JobsController {
  constructor(private readonly board: JobBoardService) {}

  @Get()
  @Can('read', 'Job')
  @ApiOperation({ summary: 'Jobs in reach: a crew lead’s crews’, a salesperson’s own, a branch’s' })
  list(@CurrentUser() user: SessionUser, @Query() q: JobListQueryDto): Promise<JobListResponse> {
    return this.board.list(user, q);
  }

  @Get('calendar')
  @Can('read', 'Job')
  @ApiOperation({ summary: 'A branch’s jobs by crew and day, and its signed jobs not yet on a crew' })
  calendar(@CurrentUser() user: SessionUser, @Query() q: CalendarQueryDto): Promise<CalendarResponse> {
    return this.board.calendar(user, q);
  }

  @Get('at-risk')
  @Can('read', 'Job')
  @ApiOperation({ summary: 'Jobs with a due date (permit, start, 811 ticket) due soon or overdue' })
  atRisk(@CurrentUser() user: SessionUser, @Query() q: BranchQueryDto): Promise<AtRiskJob[]> {
    return this.board.atRisk(user, q.branchId);
  }

  @Get('today')
  @Can('read', 'Job')
  @ApiOperation({ summary: 'The jobs running today (the crew lead’s own), on the branch’s calendar' })
  today(@CurrentUser() user: SessionUser): Promise<JobSummary[]> {
    return this.board.today(user);
  }

  @Get(':id')
  @Can('read', 'Job')
  @ApiOperation({ summary: 'One job: plan, clocks, start blockers, conflicts, permit, 811 ticket' })
  get(@CurrentUser() user: SessionUser, @Param('id', ParseUUIDPipe) id: string): Promise<JobDetail> {
    return this.board.get(user, id);
  }

  @Put(':id/schedule')
  @Can('manage', 'Job')
  @ApiOperation({
    summary: 'Put the job on a crew for a run of days, or move it (the homeowner is e-mailed)',
  })
  schedule(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: ScheduleJobDto,
  ): Promise<JobDetail> {
    return this.board.schedule(user, id, dto);
  }

  @Delete(':id/schedule')
  @Can('manage', 'Job')
  @ApiOperation({ summary: 'Take the job off the calendar before it starts' })
  unschedule(@CurrentUser() user: SessionUser, @Param('id', ParseUUIDPipe) id: string): Promise<JobDetail> {
    return this.board.unschedule(user, id);
  }

  @Post(':id/waive-window')
  @HttpCode(200)
  @Can('manage', 'Job')
  @ApiOperation({
    summary: 'Record the homeowner’s emergency waiver of the right to cancel (16 CFR 429.1(e))',
  })
  waiveWindow(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: WaiveWindowDto,
  ): Promise<JobDetail> {
    return this.board.waiveWindow(user, id, dto);
  }

  @Put(':id/permit')
  @Can('manage', 'Job')
  @ApiOperation({ summary: 'The permit: needed or not, applied on, number, issued on, inspection passed on' })
  permit(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: PermitDto,
  ): Promise<JobDetail> {
    return this.board.setPermit(user, id, dto);
  }

  @Put(':id/locate')
  @Can('manage', 'Job')
  @ApiOperation({
    summary: 'The 811 ticket: number, filed on; earliest dig date and expiry from the state pack',
  })
  locate(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: LocateDto,
  ): Promise<JobDetail> {
    return this.board.setLocate(user, id, dto);
  }

  @Post(':id/start')
  @HttpCode(200)
  @Can('update', 'Job')
  @ApiOperation({ summary: 'The crew starts the work today (409 with a code when it may not)' })
  start(@CurrentUser() user: SessionUser, @Param('id', ParseUUIDPipe) id: string): Promise<JobDetail> {
    return this.board.start(user, id);
  }
}
