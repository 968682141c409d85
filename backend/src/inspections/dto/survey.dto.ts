import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform, Type } from 'class-transformer';
import {
  ArrayMaxSize,
  ArrayMinSize,
  IsArray,
  IsIn,
  IsOptional,
  IsString,
  Matches,
  MaxLength,
  MinLength,
  ValidateNested,
} from 'class-validator';
import {
  SETTLEMENT_MAX_POINTS,
  SURVEY_DECIMAL_PATTERN,
  SURVEY_KINDS,
  SURVEY_LABEL_MAX_LENGTH,
  type PutSurveyRequest,
  type SurveyKind,
  type SurveyPoint,
} from '@loambook/common';

const trim = ({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value);
const DECIMAL_MESSAGE = 'Enter a decimal as text, at most 2 decimals (e.g. "12.5" or "-0.75").';

export class SurveyPointDto implements SurveyPoint {
  @ApiProperty({ example: 'A1', maxLength: SURVEY_LABEL_MAX_LENGTH })
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'Give the point a label.' })
  @MaxLength(SURVEY_LABEL_MAX_LENGTH)
  label: string;

  @ApiProperty({ example: '0', description: 'feet, on the survey plan' })
  @IsString({ message: DECIMAL_MESSAGE })
  @Matches(SURVEY_DECIMAL_PATTERN, { message: DECIMAL_MESSAGE })
  xFt: string;

  @ApiProperty({ example: '12.5', description: 'feet, on the survey plan' })
  @IsString({ message: DECIMAL_MESSAGE })
  @Matches(SURVEY_DECIMAL_PATTERN, { message: DECIMAL_MESSAGE })
  yFt: string;

  @ApiProperty({ example: '-0.75', description: 'inches, relative to the reference point (higher = larger)' })
  @IsString({ message: DECIMAL_MESSAGE })
  @Matches(SURVEY_DECIMAL_PATTERN, { message: DECIMAL_MESSAGE })
  elevationIn: string;
}

export class PutSurveyDto implements PutSurveyRequest {
  @ApiProperty({ type: [SurveyPointDto], minItems: 2, maxItems: SETTLEMENT_MAX_POINTS })
  @IsArray()
  @ArrayMinSize(2, { message: 'Give at least 2 survey points: a differential needs two readings.' })
  @ArrayMaxSize(SETTLEMENT_MAX_POINTS, { message: `Give at most ${SETTLEMENT_MAX_POINTS} survey points.` })
  @ValidateNested({ each: true })
  @Type(() => SurveyPointDto)
  points: SurveyPointDto[];

  @ApiProperty({
    example: 'A1',
    description: 'The point the elevations are measured from; its elevation must be 0',
  })
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'Name the reference point.' })
  @MaxLength(SURVEY_LABEL_MAX_LENGTH)
  referenceLabel: string;
}

export class SurveyKindQueryDto {
  @ApiPropertyOptional({ enum: SURVEY_KINDS, default: 'inspection' })
  @IsOptional()
  @IsIn(SURVEY_KINDS, { message: 'kind is "inspection" or "completion".' })
  kind?: SurveyKind;
}
