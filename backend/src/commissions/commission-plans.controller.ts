import { Body, Controller, Get, HttpCode, Param, ParseUUIDPipe, Patch, Post } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { CommissionPlanView } from '@loambook/common';
import { Can, CurrentUser } from '../common/decorators';
import type { SessionUser } from '../auth/session-user';
import { CommissionPlansService } from './commission-plans.service';
import { CreateCommissionPlanDto, UpdateCommissionPlanDto } from './dto/commissions.dto';

/** The owner's commission plans; the bookkeeper reads them. */
@ApiTags('commissions')
@ApiBearerAuth()
@Controller('commission-plans')
export class CommissionPlansController {
  constructor(private readonly plans: CommissionPlansService) {}

  @Get()
  @Can('read', 'CommissionPlan')
  list(@CurrentUser() user: SessionUser): Promise<CommissionPlanView[]> {
    return this.plans.list(user);
  }

  @Get(':id')
  @Can('read', 'CommissionPlan')
  get(@CurrentUser() user: SessionUser, @Param('id', ParseUUIDPipe) id: string): Promise<CommissionPlanView> {
    return this.plans.get(user, id);
  }

  @Post()
  @HttpCode(201)
  @Can('create', 'CommissionPlan')
  @ApiOperation({
    summary: 'A plan: basis, flat rate or tiers, first milestone %, start date, branch or company',
  })
  create(
    @CurrentUser() user: SessionUser,
    @Body() dto: CreateCommissionPlanDto,
  ): Promise<CommissionPlanView> {
    return this.plans.create(user, dto);
  }

  @Patch(':id')
  @Can('update', 'CommissionPlan')
  @ApiOperation({ summary: 'Change a plan (only name and active once a contract uses it)' })
  update(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: UpdateCommissionPlanDto,
  ): Promise<CommissionPlanView> {
    return this.plans.update(user, id, dto);
  }
}
