import { Body, Controller, Delete, Get, HttpCode, Param, ParseUUIDPipe, Patch, Post } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { Branch } from '@loambook/common';
import { Can, CurrentUser } from '../common/decorators';
import type { SessionUser } from '../auth/session-user';
import type { BranchDirectoryEntry } from './branches.repository';
import { BranchesService } from './branches.service';
import { CreateBranchDto, UpdateBranchDto } from './dto/branch.dto';

@ApiTags('branches')
@ApiBearerAuth()
@Controller('branches')
export class BranchesController {
  constructor(private readonly branches: BranchesService) {}

  @Get()
  @Can('read', 'Branch')
  list(@CurrentUser() user: SessionUser): Promise<Branch[]> {
    return this.branches.list(user);
  }

  // Declared before :id, which would otherwise take "directory" for an id.
  @Get('directory')
  @Can('read', 'Branch')
  directory(): Promise<BranchDirectoryEntry[]> {
    return this.branches.directory();
  }

  @Get(':id')
  @Can('read', 'Branch')
  get(@CurrentUser() user: SessionUser, @Param('id', ParseUUIDPipe) id: string): Promise<Branch> {
    return this.branches.get(user, id);
  }

  @Post()
  @Can('create', 'Branch')
  create(@CurrentUser() user: SessionUser, @Body() dto: CreateBranchDto): Promise<Branch> {
    return this.branches.create(user, dto);
  }

  @Patch(':id')
  @Can('update', 'Branch')
  update(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: UpdateBranchDto,
  ): Promise<Branch> {
    return this.branches.update(user, id, dto);
  }

  @Delete(':id')
  @Can('delete', 'Branch')
  @HttpCode(204)
  delete(@CurrentUser() user: SessionUser, @Param('id', ParseUUIDPipe) id: string): Promise<void> {
    return this.branches.delete(user, id);
  }
}
