import { Body, Controller, Get, Param, ParseUUIDPipe, Patch, Post, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Crew } from '@loambook/common';
import type { SessionUser } from '../auth/session-user';
import { Can, CurrentUser } from '../common/decorators';
import { CrewsService } from './crews.service';
import { BranchQueryDto, CrewDto, UpdateCrewDto } from './dto/jobs.dto';

@ApiTags('jobs')
@ApiBearerAuth()
@Controller('crews')
export class CrewsController {
  constructor(private readonly crews: CrewsService) {}

  @Get()
  @Can('read', 'Job')
  @ApiOperation({ summary: 'The crews of the user’s branches (or of one), with their members' })
  list(@CurrentUser() user: SessionUser, @Query() q: BranchQueryDto): Promise<Crew[]> {
    return this.crews.list(user, q.branchId);
  }

  @Post()
  @Can('manage', 'Job')
  @ApiOperation({ summary: 'A new crew: a crew lead of the branch and the people with them' })
  create(@CurrentUser() user: SessionUser, @Body() dto: CrewDto): Promise<Crew> {
    return this.crews.create(user, dto);
  }

  @Patch(':id')
  @Can('manage', 'Job')
  @ApiOperation({
    summary: 'Rename, change the lead (who takes over the crew’s jobs to do), members, active',
  })
  update(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: UpdateCrewDto,
  ): Promise<Crew> {
    return this.crews.update(user, id, dto);
  }
}
