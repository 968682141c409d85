import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform, Type } from 'class-transformer';
import {
  IsInt,
  IsOptional,
  IsString,
  IsUUID,
  Matches,
  Max,
  MaxLength,
  Min,
  ValidateNested,
} from 'class-validator';
import {
  INSPECTION_MAX_DURATION_MINUTES,
  INSPECTION_MIN_DURATION_MINUTES,
  LOCAL_DATE_TIME_PATTERN,
  type BookInspectionRequest,
  type CancelInspectionRequest,
  type CompleteInspectionRequest,
  type UpdateInspectionRequest,
} from '@loambook/common';
import { FindingsDto } from './findings.dto';

const LOCAL_TIME_MESSAGE =
  'Enter the date and time as YYYY-MM-DDTHH:mm on a 24-hour clock (e.g. 2026-12-03T09:00).';
const DURATION_MESSAGE = `Enter a duration from ${INSPECTION_MIN_DURATION_MINUTES} to ${INSPECTION_MAX_DURATION_MINUTES} minutes.`;
const emptyToNull = ({ value }: { value: unknown }) =>
  typeof value === 'string' ? value.trim() || null : value;
const emptyToUndefined = ({ value }: { value: unknown }) =>
  typeof value === 'string' ? value.trim() || undefined : value;

export class BookInspectionDto implements BookInspectionRequest {
  @ApiProperty({
    example: '2026-12-03T09:00',
    description: "Wall-clock time in the branch's time zone (branches.timezone), 24-hour, no offset",
  })
  @IsString({ message: LOCAL_TIME_MESSAGE })
  @MaxLength(16, { message: LOCAL_TIME_MESSAGE })
  @Matches(LOCAL_DATE_TIME_PATTERN, { message: LOCAL_TIME_MESSAGE })
  scheduledAt: string;

  @ApiPropertyOptional({
    example: 90,
    minimum: INSPECTION_MIN_DURATION_MINUTES,
    maximum: INSPECTION_MAX_DURATION_MINUTES,
  })
  @IsOptional()
  @IsInt({ message: DURATION_MESSAGE })
  @Min(INSPECTION_MIN_DURATION_MINUTES, { message: DURATION_MESSAGE })
  @Max(INSPECTION_MAX_DURATION_MINUTES, { message: DURATION_MESSAGE })
  durationMinutes?: number;

  @ApiPropertyOptional({ description: "Defaults to the lead's salesperson, or the person booking" })
  @IsOptional()
  @IsUUID('all', { message: 'Choose who inspects.' })
  inspectorId?: string;
}

export class UpdateInspectionDto implements UpdateInspectionRequest {
  @ApiPropertyOptional({ type: FindingsDto })
  @IsOptional()
  @ValidateNested()
  @Type(() => FindingsDto)
  findings?: FindingsDto;

  @ApiPropertyOptional({ nullable: true, maxLength: 4000 })
  @IsOptional()
  @Transform(emptyToNull)
  @IsString()
  @MaxLength(4000)
  summary?: string | null;

  @ApiPropertyOptional({
    example: '2026-12-04T13:30',
    description: "Reschedule: wall-clock time in the branch's zone",
  })
  @IsOptional()
  @IsString({ message: LOCAL_TIME_MESSAGE })
  @MaxLength(16, { message: LOCAL_TIME_MESSAGE })
  @Matches(LOCAL_DATE_TIME_PATTERN, { message: LOCAL_TIME_MESSAGE })
  scheduledAt?: string;

  @ApiPropertyOptional({ minimum: INSPECTION_MIN_DURATION_MINUTES, maximum: INSPECTION_MAX_DURATION_MINUTES })
  @IsOptional()
  @IsInt({ message: DURATION_MESSAGE })
  @Min(INSPECTION_MIN_DURATION_MINUTES, { message: DURATION_MESSAGE })
  @Max(INSPECTION_MAX_DURATION_MINUTES, { message: DURATION_MESSAGE })
  durationMinutes?: number;

  @ApiPropertyOptional({ nullable: true, description: 'null: nobody assigned' })
  @IsOptional()
  @IsUUID('all', { message: 'Choose who inspects.' })
  inspectorId?: string | null;
}

export class CompleteInspectionDto implements CompleteInspectionRequest {
  @ApiPropertyOptional({ maxLength: 4000, description: 'Replaces the summary when given' })
  @IsOptional()
  @Transform(emptyToUndefined)
  @IsString()
  @MaxLength(4000)
  summary?: string;
}

export class CancelInspectionDto implements CancelInspectionRequest {
  @ApiPropertyOptional({ maxLength: 500, example: 'Homeowner rescheduling after the holidays' })
  @IsOptional()
  @Transform(emptyToUndefined)
  @IsString()
  @MaxLength(500)
  reason?: string;
}
