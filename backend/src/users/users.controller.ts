import { Body, Controller, Get, Param, ParseUUIDPipe, Patch, Post, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiQuery, ApiTags } from '@nestjs/swagger';
import type { UserSummary } from '@loambook/common';
import { Can, CurrentUser } from '../common/decorators';
import type { SessionUser } from '../auth/session-user';
import { InviteUserDto, UpdateUserDto } from './dto/user.dto';
import { UsersService } from './users.service';
import { BranchFilterDto } from './dto/branch-filter.dto';

@ApiTags('users')
@ApiBearerAuth()
@Controller('users')
export class UsersController {
  constructor(private readonly users: UsersService) {}

  @Get()
  @Can('read', 'User')
  @ApiQuery({ name: 'branchId', required: false })
  list(@CurrentUser() user: SessionUser, @Query() filter: BranchFilterDto): Promise<UserSummary[]> {
    return this.users.list(user, filter);
  }

  @Get(':id')
  @Can('read', 'User')
  get(@CurrentUser() user: SessionUser, @Param('id', ParseUUIDPipe) id: string): Promise<UserSummary> {
    return this.users.get(user, id);
  }

  @Post()
  @Can('create', 'User')
  invite(@CurrentUser() user: SessionUser, @Body() dto: InviteUserDto): Promise<UserSummary> {
    return this.users.invite(user, dto);
  }

  @Patch(':id')
  @Can('update', 'User')
  update(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: UpdateUserDto,
  ): Promise<UserSummary> {
    return this.users.update(user, id, dto);
  }

  @Post(':id/invitation')
  @Can('update', 'User')
  resendInvitation(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
  ): Promise<UserSummary> {
    return this.users.resendInvitation(user, id);
  }
}
