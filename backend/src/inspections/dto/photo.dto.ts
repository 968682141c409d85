import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import { IsOptional, IsString, MaxLength, ValidateIf } from 'class-validator';
import { PHOTO_CAPTION_MAX_LENGTH, type UpdatePhotoRequest } from '@loambook/common';

const emptyToNull = ({ value }: { value: unknown }) =>
  typeof value === 'string' ? value.trim() || null : value;

/** The text fields of the multipart upload; the file itself is the part named "file". */
export class UploadPhotoDto {
  @ApiPropertyOptional({ maxLength: PHOTO_CAPTION_MAX_LENGTH })
  @IsOptional()
  @Transform(emptyToNull)
  @IsString()
  @MaxLength(PHOTO_CAPTION_MAX_LENGTH)
  caption?: string | null;
}

export class UpdatePhotoDto implements UpdatePhotoRequest {
  @ApiProperty({
    nullable: true,
    maxLength: PHOTO_CAPTION_MAX_LENGTH,
    example: 'Stair-step crack, east wall',
  })
  @Transform(emptyToNull)
  @ValidateIf((o: UpdatePhotoDto) => o.caption !== null)
  @IsString({ message: 'Give a caption, or null to remove it.' })
  @MaxLength(PHOTO_CAPTION_MAX_LENGTH)
  caption: string | null;
}
