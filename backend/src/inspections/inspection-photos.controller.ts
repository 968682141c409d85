import {
  Body,
  Controller,
  Delete,
  Get,
  HttpCode,
  Param,
  ParseUUIDPipe,
  Patch,
  Post,
  Res,
  StreamableFile,
  UploadedFile,
  UseFilters,
  UseInterceptors,
} from '@nestjs/common';
import { FileInterceptor } from '@nestjs/platform-express';
import { ApiBearerAuth, ApiBody, ApiConsumes, ApiProduces, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import { PHOTO_MAX_BYTES, type InspectionPhoto } from '@loambook/common';
import { Can, CurrentUser } from '../common/decorators';
import type { SessionUser } from '../auth/session-user';
import {
  InspectionPhotosService,
  type PhotoContent,
  type UploadedPhotoFile,
} from './inspection-photos.service';
import { UpdatePhotoDto, UploadPhotoDto } from './dto/photo.dto';
import { UploadErrorsFilter } from './upload-errors';

@ApiTags('inspections')
@ApiBearerAuth()
@Controller()
export class InspectionPhotosController {
  constructor(private readonly photos: InspectionPhotosService) {}

  @Post('inspections/:id/photos')
  @Can('update', 'Inspection')
  @UseFilters(UploadErrorsFilter)
  // No storage option: multer keeps the file in memory, and the service writes it to the bucket.
  @UseInterceptors(FileInterceptor('file', { limits: { fileSize: PHOTO_MAX_BYTES, files: 1, fields: 4 } }))
  @ApiConsumes('multipart/form-data')
  @ApiBody({
    schema: {
      type: 'object',
      required: ['file'],
      properties: {
        file: { type: 'string', format: 'binary', description: 'JPEG, PNG, WebP or HEIC, at most 15 MB' },
        caption: { type: 'string', maxLength: 300 },
      },
    },
  })
  upload(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @UploadedFile() file: UploadedPhotoFile | undefined,
    @Body() dto: UploadPhotoDto,
  ): Promise<InspectionPhoto> {
    return this.photos.upload(user, id, file, dto.caption ?? null);
  }

  @Get('inspections/:id/photos')
  @Can('read', 'Inspection')
  list(@CurrentUser() user: SessionUser, @Param('id', ParseUUIDPipe) id: string): Promise<InspectionPhoto[]> {
    return this.photos.list(user, id);
  }

  @Get('photos/:id/content')
  @Can('read', 'Inspection')
  @ApiProduces('image/jpeg', 'image/png', 'image/webp', 'image/heic')
  async content(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Res({ passthrough: true }) res: Response,
  ): Promise<StreamableFile> {
    return stream(res, await this.photos.content(user, id, 'original'));
  }

  @Get('photos/:id/thumbnail')
  @Can('read', 'Inspection')
  @ApiProduces('image/jpeg')
  async thumbnail(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Res({ passthrough: true }) res: Response,
  ): Promise<StreamableFile> {
    return stream(res, await this.photos.content(user, id, 'thumbnail'));
  }

  @Patch('photos/:id')
  @Can('update', 'Inspection')
  update(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: UpdatePhotoDto,
  ): Promise<InspectionPhoto> {
    return this.photos.updateCaption(user, id, dto.caption);
  }

  @Delete('photos/:id')
  @Can('update', 'Inspection')
  @HttpCode(204)
  delete(@CurrentUser() user: SessionUser, @Param('id', ParseUUIDPipe) id: string): Promise<void> {
    return this.photos.delete(user, id);
  }
}

/** A photo's bytes: never cached by a shared cache, never sniffed as another type. */
function stream(res: Response, file: PhotoContent): StreamableFile {
  res.setHeader('Cache-Control', 'private, max-age=300');
  return new StreamableFile(file.stream, {
    type: file.contentType,
    length: file.length,
    disposition: `inline; filename="${file.filename}"`,
  });
}
