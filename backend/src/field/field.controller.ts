import {
  Body,
  Controller,
  Get,
  HttpCode,
  Ip,
  Param,
  ParseUUIDPipe,
  Post,
  Query,
  Res,
  StreamableFile,
  UploadedFile,
  UseFilters,
  UseInterceptors,
} from '@nestjs/common';
import { FileInterceptor } from '@nestjs/platform-express';
import { ApiBearerAuth, ApiBody, ApiConsumes, ApiOperation, ApiProduces, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import {
  PHOTO_MAX_BYTES,
  type ActualsSummaryRow,
  type DayNote,
  type InstallEntry,
  type InstallLogResponse,
  type JobActuals,
  type JobDetail,
  type JobPhoto,
  type SurveyComparison,
  type Warranty,
} from '@loambook/common';
import type { SessionUser } from '../auth/session-user';
import { Can, CurrentUser } from '../common/decorators';
import type { UploadedPhotoFile } from '../inspections/inspection-photos.service';
import { UploadErrorsFilter } from '../inspections/upload-errors';
import { JobsService } from '../jobs/jobs.service';
import { pdfFile } from '../signing/signing.controller';
import { ActualsService } from './actuals.service';
import { CompletionService } from './completion.service';
import {
  ActualsSummaryQueryDto,
  CompleteJobDto,
  DayNoteDto,
  InstallEntryDto,
  UploadJobPhotoDto,
  WarrantyDto,
} from './dto/field.dto';
import { InstallLogService, type PhotoContent } from './install-log.service';
import { WarrantyService } from './warranty.service';

/**
 * The crew's log, completion, actuals and warranty of a job (issue #4). Type-level rule on each route
 * (a salesperson may read their job's log but writes nothing: 403); the job itself is checked in the
 * services (outside the user's reach: 404).
 */
@ApiTags('field')
@ApiBearerAuth()
@Controller('jobs')
export class FieldController {
  constructor(
    private readonly log: InstallLogService,
    private readonly completion: CompletionService,
    private readonly actuals: ActualsService,
    private readonly warranties: WarrantyService,
    private readonly jobs: JobsService,
  ) {}

  // Static path first: it is never taken for a job id.
  @Get('actuals/summary')
  @Can('read', 'Job')
  @ApiOperation({ summary: 'Actual against estimated margin of completed jobs, per salesperson or branch' })
  summary(
    @CurrentUser() user: SessionUser,
    @Query() q: ActualsSummaryQueryDto,
  ): Promise<ActualsSummaryRow[]> {
    return this.actuals.summary(user, q);
  }

  @Get(':id/log')
  @Can('read', 'Job')
  getLog(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
  ): Promise<InstallLogResponse> {
    return this.log.log(user, id);
  }

  @Post(':id/log/entries')
  @Can('update', 'Job')
  @ApiOperation({ summary: 'Log an injection point or a pier: 201 written, 200 already stored (a resend)' })
  async addEntry(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: InstallEntryDto,
    @Res({ passthrough: true }) res: Response,
  ): Promise<InstallEntry> {
    const { row, created } = await this.log.addEntry(user, id, dto);
    res.status(created ? 201 : 200);
    return row;
  }

  @Post(':id/log/day-notes')
  @Can('update', 'Job')
  @ApiOperation({ summary: 'The day’s note and labour hours: 201 written, 200 already stored (a resend)' })
  async addDayNote(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: DayNoteDto,
    @Res({ passthrough: true }) res: Response,
  ): Promise<DayNote> {
    const { row, created } = await this.log.addDayNote(user, id, dto);
    res.status(created ? 201 : 200);
    return row;
  }

  @Post(':id/photos')
  @Can('update', 'Job')
  @UseFilters(UploadErrorsFilter)
  @UseInterceptors(FileInterceptor('file', { limits: { fileSize: PHOTO_MAX_BYTES, files: 1, fields: 4 } }))
  @ApiConsumes('multipart/form-data')
  @ApiBody({
    schema: {
      type: 'object',
      required: ['file'],
      properties: {
        file: { type: 'string', format: 'binary', description: 'JPEG, PNG, WebP or HEIC, at most 15 MB' },
        caption: { type: 'string', maxLength: 300 },
        installEntryId: { type: 'string', format: 'uuid' },
        clientPhotoId: { type: 'string', format: 'uuid' },
      },
    },
  })
  @ApiOperation({ summary: 'A photo of the job or of a log row: 201 stored, 200 already stored (a resend)' })
  async uploadPhoto(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @UploadedFile() file: UploadedPhotoFile | undefined,
    @Body() dto: UploadJobPhotoDto,
    @Res({ passthrough: true }) res: Response,
  ): Promise<JobPhoto> {
    const { row, created } = await this.log.uploadPhoto(user, id, file, {
      caption: dto.caption || null,
      installEntryId: dto.installEntryId ?? null,
      clientPhotoId: dto.clientPhotoId ?? null,
    });
    res.status(created ? 201 : 200);
    return row;
  }

  @Get(':id/photos/:photoId')
  @Can('read', 'Job')
  @ApiProduces('image/jpeg', 'image/png', 'image/webp', 'image/heic')
  async photo(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Param('photoId', ParseUUIDPipe) photoId: string,
    @Res({ passthrough: true }) res: Response,
  ): Promise<StreamableFile> {
    return stream(res, await this.log.photoContent(user, id, photoId, 'original'));
  }

  @Get(':id/photos/:photoId/thumbnail')
  @Can('read', 'Job')
  @ApiProduces('image/jpeg')
  async thumbnail(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Param('photoId', ParseUUIDPipe) photoId: string,
    @Res({ passthrough: true }) res: Response,
  ): Promise<StreamableFile> {
    return stream(res, await this.log.photoContent(user, id, photoId, 'thumbnail'));
  }

  @Get(':id/survey-comparison')
  @Can('read', 'Job')
  surveyComparison(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
  ): Promise<SurveyComparison> {
    return this.completion.surveyComparison(user, id);
  }

  @Post(':id/complete')
  @HttpCode(200)
  @Can('update', 'Job')
  @ApiOperation({ summary: 'Checklist, re-survey and the homeowner’s signature: the job and lead completed' })
  async complete(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: CompleteJobDto,
    @Ip() ip: string,
  ): Promise<JobDetail> {
    await this.completion.complete(user, id, dto, ip || null);
    return this.jobs.detail(user, id);
  }

  @Get(':id/actuals')
  @Can('read', 'Job')
  jobActuals(@CurrentUser() user: SessionUser, @Param('id', ParseUUIDPipe) id: string): Promise<JobActuals> {
    return this.actuals.forJob(user, id);
  }

  @Post(':id/warranty')
  @Can('update', 'Job')
  issueWarranty(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: WarrantyDto,
  ): Promise<Warranty> {
    return this.warranties.issue(user, id, dto);
  }

  @Get(':id/warranty')
  @Can('read', 'Job')
  warranty(@CurrentUser() user: SessionUser, @Param('id', ParseUUIDPipe) id: string): Promise<Warranty> {
    return this.warranties.get(user, id);
  }

  @Get(':id/warranty/certificate.pdf')
  @Can('read', 'Job')
  @ApiProduces('application/pdf')
  async certificate(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Res({ passthrough: true }) res: Response,
  ): Promise<StreamableFile> {
    return pdfFile(res, await this.warranties.certificate(user, id));
  }
}

/** A photo's bytes, as the inspection photos answer them: private cache only. */
function stream(res: Response, file: PhotoContent): StreamableFile {
  res.setHeader('Cache-Control', 'private, max-age=300');
  return new StreamableFile(file.stream, {
    type: file.contentType,
    length: file.length,
    disposition: `inline; filename="${file.filename}"`,
  });
}
