import {
  Body,
  Controller,
  Get,
  HttpCode,
  Param,
  ParseUUIDPipe,
  Patch,
  Post,
  Put,
  Query,
} from '@nestjs/common';
import { ApiBearerAuth, ApiQuery, ApiTags } from '@nestjs/swagger';
import type { Inspection, Survey } from '@loambook/common';
import { Can, CurrentUser } from '../common/decorators';
import type { SessionUser } from '../auth/session-user';
import { InspectionsService } from './inspections.service';
import {
  BookInspectionDto,
  CancelInspectionDto,
  CompleteInspectionDto,
  UpdateInspectionDto,
} from './dto/inspection.dto';
import { PutSurveyDto, SurveyKindQueryDto } from './dto/survey.dto';

@ApiTags('inspections')
@ApiBearerAuth()
@Controller()
export class InspectionsController {
  constructor(private readonly inspections: InspectionsService) {}

  @Post('leads/:leadId/inspections')
  @Can('create', 'Inspection')
  book(
    @CurrentUser() user: SessionUser,
    @Param('leadId', ParseUUIDPipe) leadId: string,
    @Body() dto: BookInspectionDto,
  ): Promise<Inspection> {
    return this.inspections.book(user, leadId, dto);
  }

  @Get('leads/:leadId/inspections')
  @Can('read', 'Inspection')
  listForLead(
    @CurrentUser() user: SessionUser,
    @Param('leadId', ParseUUIDPipe) leadId: string,
  ): Promise<Inspection[]> {
    return this.inspections.listForLead(user, leadId);
  }

  @Get('inspections/:id')
  @Can('read', 'Inspection')
  get(@CurrentUser() user: SessionUser, @Param('id', ParseUUIDPipe) id: string): Promise<Inspection> {
    return this.inspections.get(user, id);
  }

  @Patch('inspections/:id')
  @Can('update', 'Inspection')
  update(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: UpdateInspectionDto,
  ): Promise<Inspection> {
    return this.inspections.update(user, id, dto);
  }

  @Post('inspections/:id/complete')
  @Can('update', 'Inspection')
  @HttpCode(200)
  complete(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: CompleteInspectionDto,
  ): Promise<Inspection> {
    return this.inspections.complete(user, id, dto);
  }

  @Post('inspections/:id/cancel')
  @Can('update', 'Inspection')
  @HttpCode(200)
  cancel(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: CancelInspectionDto,
  ): Promise<Inspection> {
    return this.inspections.cancel(user, id, dto);
  }

  @Get('inspections/:id/survey')
  @Can('read', 'Inspection')
  @ApiQuery({ name: 'kind', required: false, enum: ['inspection', 'completion'] })
  getSurvey(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Query() query: SurveyKindQueryDto,
  ): Promise<Survey> {
    return this.inspections.getSurvey(user, id, query.kind ?? 'inspection');
  }

  @Put('inspections/:id/survey')
  @Can('update', 'Inspection')
  @ApiQuery({ name: 'kind', required: false, enum: ['inspection', 'completion'] })
  putSurvey(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Query() query: SurveyKindQueryDto,
    @Body() dto: PutSurveyDto,
  ): Promise<Survey> {
    return this.inspections.putSurvey(user, id, query.kind ?? 'inspection', dto);
  }
}
