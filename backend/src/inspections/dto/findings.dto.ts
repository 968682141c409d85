import { applyDecorators } from '@nestjs/common';
import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform, Type } from 'class-transformer';
import {
  ArrayMaxSize,
  IsArray,
  IsBoolean,
  IsIn,
  IsOptional,
  IsString,
  Matches,
  MaxLength,
  MinLength,
  ValidateNested,
} from 'class-validator';
import {
  CRACK_ORIENTATIONS,
  CRACK_WIDTH_PATTERN,
  FINDINGS_LOCATION_MAX_LENGTH,
  FINDINGS_MAX_ENTRIES,
  FINDINGS_NOTE_MAX_LENGTH,
  GRADINGS,
  GUTTER_COVERAGES,
  SOIL_MOISTURES,
  SOIL_TYPES,
  type CrackFinding,
  type CrackOrientation,
  type DrainageFinding,
  type Grading,
  type GutterCoverage,
  type FindingsPatch,
  type LocationFinding,
  type ObservedFinding,
  type SoilFinding,
  type SoilMoisture,
  type SoilType,
} from '@loambook/common';

const trim = ({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value);
/** An empty note is no note. */
const note = ({ value }: { value: unknown }) =>
  typeof value === 'string' ? value.trim() || undefined : value === null ? undefined : value;

class NoteField {
  @ApiPropertyOptional({ maxLength: FINDINGS_NOTE_MAX_LENGTH })
  @IsOptional()
  @Transform(note)
  @IsString()
  @MaxLength(FINDINGS_NOTE_MAX_LENGTH)
  note?: string;
}

export class CrackFindingDto extends NoteField implements CrackFinding {
  @ApiProperty({ example: 'Living room, NE corner above the window' })
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'Say where the crack is.' })
  @MaxLength(FINDINGS_LOCATION_MAX_LENGTH)
  location: string;

  @ApiProperty({ example: '0.125', description: 'Width at the widest point, inches, decimal string' })
  @IsString()
  @Matches(CRACK_WIDTH_PATTERN, {
    message: 'Enter the width in inches as a decimal above 0, at most 4 decimals (1/16 in = "0.0625").',
  })
  widthIn: string;

  @ApiProperty({ enum: CRACK_ORIENTATIONS })
  @IsIn(CRACK_ORIENTATIONS, { message: 'Choose which way the crack runs.' })
  orientation: CrackOrientation;
}

export class LocationFindingDto extends NoteField implements LocationFinding {
  @ApiProperty({ example: 'Back bedroom door' })
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'Say which door or window.' })
  @MaxLength(FINDINGS_LOCATION_MAX_LENGTH)
  location: string;
}

export class ObservedFindingDto extends NoteField implements ObservedFinding {
  @ApiProperty()
  @IsBoolean({ message: 'Answer yes or no.' })
  observed: boolean;
}

export class DrainageFindingDto extends NoteField implements DrainageFinding {
  @ApiProperty({ enum: GUTTER_COVERAGES })
  @IsIn(GUTTER_COVERAGES, { message: 'Choose the gutter coverage.' })
  gutters: GutterCoverage;

  @ApiProperty()
  @IsBoolean({ message: 'Answer yes or no.' })
  downspoutsDischargeNearFoundation: boolean;

  @ApiProperty({ enum: GRADINGS })
  @IsIn(GRADINGS, { message: 'Choose which way the ground slopes.' })
  grading: Grading;
}

export class SoilFindingDto extends NoteField implements SoilFinding {
  @ApiProperty({ enum: SOIL_TYPES })
  @IsIn(SOIL_TYPES, { message: 'Choose the kind of soil.' })
  type: SoilType;

  @ApiProperty({ enum: SOIL_MOISTURES })
  @IsIn(SOIL_MOISTURES, { message: 'Choose how wet the soil is.' })
  moisture: SoilMoisture;
}

/** An optional list of entries, each validated as its own class (given with @Type). */
const listOfEntries = () =>
  applyDecorators(
    IsOptional(),
    IsArray({ message: 'Give a list (an empty list means none seen).' }),
    ArrayMaxSize(FINDINGS_MAX_ENTRIES, { message: `Record at most ${FINDINGS_MAX_ENTRIES} entries.` }),
    ValidateNested({ each: true }),
  );

/**
 * Findings as sent in PATCH /inspections/:id: every item optional. An item given replaces the stored
 * one whole; null clears it; an item left out stays as it is.
 */
export class FindingsDto implements FindingsPatch {
  @ApiPropertyOptional({ type: [CrackFindingDto] })
  @listOfEntries()
  @Type(() => CrackFindingDto)
  interiorCracks?: CrackFindingDto[] | null;

  @ApiPropertyOptional({ type: [CrackFindingDto] })
  @listOfEntries()
  @Type(() => CrackFindingDto)
  exteriorCracks?: CrackFindingDto[] | null;

  @ApiPropertyOptional({ type: [LocationFindingDto] })
  @listOfEntries()
  @Type(() => LocationFindingDto)
  doorsWindowsSticking?: LocationFindingDto[] | null;

  @ApiPropertyOptional({ type: ObservedFindingDto })
  @IsOptional()
  @ValidateNested()
  @Type(() => ObservedFindingDto)
  floorSlope?: ObservedFindingDto | null;

  @ApiPropertyOptional({ type: ObservedFindingDto })
  @IsOptional()
  @ValidateNested()
  @Type(() => ObservedFindingDto)
  erosion?: ObservedFindingDto | null;

  @ApiPropertyOptional({ type: DrainageFindingDto })
  @IsOptional()
  @ValidateNested()
  @Type(() => DrainageFindingDto)
  drainage?: DrainageFindingDto | null;

  @ApiPropertyOptional({ type: ObservedFindingDto })
  @IsOptional()
  @ValidateNested()
  @Type(() => ObservedFindingDto)
  wallRotation?: ObservedFindingDto | null;

  @ApiPropertyOptional({ type: ObservedFindingDto })
  @IsOptional()
  @ValidateNested()
  @Type(() => ObservedFindingDto)
  plumbingLeaks?: ObservedFindingDto | null;

  @ApiPropertyOptional({ type: SoilFindingDto })
  @IsOptional()
  @ValidateNested()
  @Type(() => SoilFindingDto)
  soil?: SoilFindingDto | null;
}
