import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform, Type } from 'class-transformer';
import {
  ArrayMaxSize,
  IsArray,
  IsBoolean,
  IsIn,
  IsInt,
  IsISO8601,
  IsOptional,
  IsString,
  IsUUID,
  Matches,
  Max,
  MaxLength,
  Min,
  MinLength,
  ValidateNested,
} from 'class-validator';
import {
  HELICAL_SHAFTS,
  INSTALL_KINDS,
  SETTLEMENT_MAX_POINTS,
  STOP_REASONS,
  SURVEY_DECIMAL_PATTERN,
  WARRANTY_LIMITS,
  type CompleteJobInput,
  type CompletionChecklist,
  type DayNoteInput,
  type HelicalShaft,
  type InstallEntryInput,
  type InstallKind,
  type JobPhotoUploadFields,
  type StopReason,
  type SurveyPointInput,
  type WarrantyInput,
} from '@loambook/common';

const trim = ({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value);
const DATE = /^\d{4}-\d{2}-\d{2}$/;
/** A decimal as text; its format and range are checked by the rule in common (checkInstallEntry). */
const DECIMAL_TEXT = { message: 'Enter the figure as text, e.g. "12.5".' };

export class InstallEntryDto implements InstallEntryInput {
  @ApiProperty({ format: 'uuid', description: "The phone's own id for the row: a resend finds it stored" })
  @IsUUID('all', { message: 'clientRowId must be a uuid made on the phone.' })
  clientRowId: string;

  @ApiProperty({ enum: INSTALL_KINDS })
  @IsIn(INSTALL_KINDS as InstallKind[], { message: 'Kind is injection, push_pier or helical_pile.' })
  kind: InstallKind;

  @ApiProperty({ minimum: 1, maximum: 9999 })
  @IsInt({ message: 'The number is a whole number.' })
  @Min(1)
  @Max(9999)
  number: number;

  @ApiPropertyOptional({ maxLength: 120, nullable: true })
  @IsOptional()
  @Transform(trim)
  @IsString()
  @MaxLength(120)
  location?: string | null;

  @ApiPropertyOptional({ example: '15', nullable: true })
  @IsOptional()
  @IsString(DECIMAL_TEXT)
  @MaxLength(20)
  locationFt?: string | null;

  @ApiPropertyOptional({ example: '6.5', nullable: true })
  @IsOptional()
  @IsString(DECIMAL_TEXT)
  @MaxLength(20)
  depthFt?: string | null;

  @ApiPropertyOptional({ example: '21.5', nullable: true, description: 'injection: pounds pumped' })
  @IsOptional()
  @IsString(DECIMAL_TEXT)
  @MaxLength(20)
  pounds?: string | null;

  @ApiPropertyOptional({ enum: STOP_REASONS, nullable: true })
  @IsOptional()
  @IsIn(STOP_REASONS as StopReason[], {
    message: 'Why it stopped: surface_return, lift_observed, planned_quantity or other.',
  })
  stopReason?: StopReason | null;

  @ApiPropertyOptional({ example: '4200', nullable: true, description: 'push pier: final pressure, psi' })
  @IsOptional()
  @IsString(DECIMAL_TEXT)
  @MaxLength(20)
  finalPressurePsi?: string | null;

  @ApiPropertyOptional({ example: '3000', nullable: true, description: 'helical pile: final torque, ft·lb' })
  @IsOptional()
  @IsString(DECIMAL_TEXT)
  @MaxLength(20)
  torqueFtLb?: string | null;

  @ApiPropertyOptional({ enum: HELICAL_SHAFTS, nullable: true })
  @IsOptional()
  @IsIn(HELICAL_SHAFTS as unknown as HelicalShaft[], {
    message: `The shaft is one of ${HELICAL_SHAFTS.join(', ')}.`,
  })
  shaft?: HelicalShaft | null;

  @ApiPropertyOptional({ example: '18000', nullable: true, description: 'design (service) load, lb' })
  @IsOptional()
  @IsString(DECIMAL_TEXT)
  @MaxLength(20)
  designLoadLb?: string | null;

  @ApiPropertyOptional({ maxLength: 2000, nullable: true })
  @IsOptional()
  @IsString()
  @MaxLength(2000)
  note?: string | null;

  @ApiProperty({ example: '2026-07-20T14:05:00Z', description: 'when the crew wrote it on the phone' })
  @IsISO8601({ strict: true }, { message: 'loggedAt is an ISO-8601 instant.' })
  @MaxLength(40)
  loggedAt: string;
}

export class DayNoteDto implements DayNoteInput {
  @ApiProperty({ format: 'uuid' })
  @IsUUID('all', { message: 'clientRowId must be a uuid made on the phone.' })
  clientRowId: string;

  @ApiProperty({ example: '2026-07-20' })
  @IsString()
  @Matches(DATE, { message: 'The work date is YYYY-MM-DD.' })
  workDate: string;

  @ApiPropertyOptional({ maxLength: 4000, nullable: true })
  @IsOptional()
  @IsString()
  @MaxLength(4000)
  note?: string | null;

  @ApiPropertyOptional({ minimum: 1, maximum: 50, nullable: true })
  @IsOptional()
  @IsInt({ message: 'The crew size is a whole number.' })
  @Min(1)
  @Max(50)
  crewSize?: number | null;

  @ApiProperty({ example: '16.5', description: 'labour hours of the whole crew that day' })
  @IsString(DECIMAL_TEXT)
  @Matches(/^\d{1,4}(\.\d{1,2})?$/, { message: 'Labour hours: a number such as "16.5", at most 2 decimals.' })
  labourHours: string;
}

export class UploadJobPhotoDto implements JobPhotoUploadFields {
  @ApiPropertyOptional({ maxLength: 300 })
  @IsOptional()
  @Transform(trim)
  @IsString()
  @MaxLength(300)
  caption?: string;

  @ApiPropertyOptional({ format: 'uuid', description: 'the log row the photo shows' })
  @IsOptional()
  @Transform(({ value }) => (value === '' ? undefined : value))
  @IsUUID('all', { message: 'installEntryId is the id of a row of this job’s log.' })
  installEntryId?: string;

  @ApiPropertyOptional({
    format: 'uuid',
    description: 'the phone’s id for the photo: a resend answers 200 with the photo already stored',
  })
  @IsOptional()
  @Transform(({ value }) => (value === '' ? undefined : value))
  @IsUUID('all', { message: 'clientPhotoId is a uuid the phone makes for each photo.' })
  clientPhotoId?: string;
}

/** Every item optional here: an unanswered one is refused by the rule (422, listing them all). */
export class ChecklistDto implements Partial<Record<keyof CompletionChecklist, boolean | null>> {
  @ApiPropertyOptional({ nullable: true })
  @IsOptional()
  @IsBoolean()
  siteCleaned?: boolean | null;

  @ApiPropertyOptional({ nullable: true })
  @IsOptional()
  @IsBoolean()
  injectionHolesPatched?: boolean | null;

  @ApiPropertyOptional({ nullable: true })
  @IsOptional()
  @IsBoolean()
  plumbingChecked?: boolean | null;

  @ApiPropertyOptional({ nullable: true })
  @IsOptional()
  @IsBoolean()
  doorsWindowsChecked?: boolean | null;

  @ApiPropertyOptional({ nullable: true })
  @IsOptional()
  @IsBoolean()
  drainageRestored?: boolean | null;

  @ApiPropertyOptional({ nullable: true })
  @IsOptional()
  @IsBoolean()
  homeownerWalkthrough?: boolean | null;
}

const SURVEY_DECIMAL_MESSAGE = 'Enter a decimal as text, at most 2 decimals (e.g. "12.5" or "-0.75").';

export class ResurveyPointDto implements SurveyPointInput {
  @ApiProperty({ example: 'A', maxLength: 16 })
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'Give the point a label.' })
  @MaxLength(16)
  label: string;

  @ApiProperty({ example: '0' })
  @IsString({ message: SURVEY_DECIMAL_MESSAGE })
  @Matches(SURVEY_DECIMAL_PATTERN, { message: SURVEY_DECIMAL_MESSAGE })
  xFt: string;

  @ApiProperty({ example: '25' })
  @IsString({ message: SURVEY_DECIMAL_MESSAGE })
  @Matches(SURVEY_DECIMAL_PATTERN, { message: SURVEY_DECIMAL_MESSAGE })
  yFt: string;

  @ApiProperty({ example: '-0.25' })
  @IsString({ message: SURVEY_DECIMAL_MESSAGE })
  @Matches(SURVEY_DECIMAL_PATTERN, { message: SURVEY_DECIMAL_MESSAGE })
  elevationIn: string;

  @ApiPropertyOptional()
  @IsOptional()
  @IsBoolean()
  isReference?: boolean;
}

export class CompleteJobDto implements Omit<CompleteJobInput, 'checklist'> {
  @ApiProperty({ type: ChecklistDto, description: 'every item answered true or false' })
  @IsOptional()
  @ValidateNested()
  @Type(() => ChecklistDto)
  checklist?: ChecklistDto;

  @ApiProperty({ type: [ResurveyPointDto], minItems: 3 })
  @IsArray()
  @ArrayMaxSize(SETTLEMENT_MAX_POINTS)
  @ValidateNested({ each: true })
  @Type(() => ResurveyPointDto)
  resurvey: ResurveyPointDto[];

  @ApiProperty({ maxLength: 120 })
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'Give the name of the homeowner signing.' })
  @MaxLength(120)
  homeownerName: string;

  @ApiProperty({ description: 'data:image/png;base64,… from the signature pad' })
  @IsString()
  @MaxLength(1_000_000)
  signaturePng: string;

  @ApiPropertyOptional({ maxLength: 4000, nullable: true })
  @IsOptional()
  @IsString()
  @MaxLength(4000)
  note?: string | null;
}

export class WarrantyDto implements WarrantyInput {
  @ApiProperty({ minimum: WARRANTY_LIMITS.termYearsMin, maximum: WARRANTY_LIMITS.termYearsMax })
  @IsInt({ message: 'The term is a whole number of years.' })
  @Min(WARRANTY_LIMITS.termYearsMin)
  @Max(WARRANTY_LIMITS.termYearsMax)
  termYears: number;

  @ApiProperty({ maxLength: WARRANTY_LIMITS.textMaxLength })
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'Say what the warranty covers.' })
  @MaxLength(WARRANTY_LIMITS.textMaxLength)
  covers: string;

  @ApiPropertyOptional({ maxLength: WARRANTY_LIMITS.textMaxLength, nullable: true })
  @IsOptional()
  @Transform(trim)
  @IsString()
  @MaxLength(WARRANTY_LIMITS.textMaxLength)
  exclusions?: string | null;

  @ApiProperty()
  @IsBoolean({ message: 'Say whether the warranty passes to a later owner (true or false).' })
  transferable: boolean;
}

export class ActualsSummaryQueryDto {
  @ApiPropertyOptional({ format: 'uuid' })
  @IsOptional()
  @IsUUID('all')
  branchId?: string;

  @ApiPropertyOptional({ example: '2026-07-01', description: 'completed on or after (branch time)' })
  @IsOptional()
  @Matches(DATE, { message: 'from is YYYY-MM-DD.' })
  from?: string;

  @ApiPropertyOptional({ example: '2026-07-31', description: 'completed on or before (branch time)' })
  @IsOptional()
  @Matches(DATE, { message: 'to is YYYY-MM-DD.' })
  to?: string;

  @ApiPropertyOptional({ enum: ['salesperson', 'branch'], default: 'salesperson' })
  @IsOptional()
  @IsIn(['salesperson', 'branch'], { message: 'by is salesperson or branch.' })
  by?: 'salesperson' | 'branch';
}
