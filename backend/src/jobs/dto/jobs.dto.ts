import { ApiProperty, ApiPropertyOptional, PartialType } from '@nestjs/swagger';
import { Transform, Type } from 'class-transformer';
import {
  ArrayMaxSize,
  IsArray,
  IsBoolean,
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
  ValidateIf,
  ValidateNested,
} from 'class-validator';
import type {
  CrewInput,
  CrewMember,
  JobStatus,
  LocateInput,
  PermitInput,
  ScheduleJobInput,
  WaiveWindowInput,
} from '@loambook/common';

const trim = ({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value);
const emptyToNull = ({ value }: { value: unknown }) =>
  typeof value === 'string' ? value.trim() || null : value;
const PHONE = /^[0-9+()\-. ]{7,32}$/;
const DATE = /^\d{4}-\d{2}-\d{2}$/;
const dateMessage = (label: string) => ({ message: `${label}: a date written YYYY-MM-DD.` });

/** A required calendar date 'YYYY-MM-DD' that exists (2026-02-30 does not). */
function CalendarDate(label: string): PropertyDecorator {
  return (target, key) => {
    Matches(DATE, dateMessage(label))(target, key);
    IsISO8601({ strict: true }, dateMessage(label))(target, key);
  };
}

export const JOB_STATUSES: readonly JobStatus[] = [
  'unscheduled',
  'scheduled',
  'in_progress',
  'completed',
  'cancelled',
];

export class CrewMemberDto implements CrewMember {
  @ApiPropertyOptional({ format: 'uuid' })
  @IsOptional()
  @IsUUID('all')
  id?: string;

  @ApiProperty({ example: 'Rowan Pell' })
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'Enter the member’s name.' })
  @MaxLength(100)
  name: string;

  @ApiPropertyOptional({ example: '555-0161' })
  @IsOptional()
  @Transform(emptyToNull)
  @Matches(PHONE, { message: 'Enter a phone number (digits, spaces, dashes).' })
  @MaxLength(32)
  phone?: string | null;
}

export class CrewDto implements CrewInput {
  @ApiProperty({ format: 'uuid' })
  @IsUUID('all', { message: 'Choose a branch.' })
  branchId: string;

  @ApiProperty({ example: 'East crew' })
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'Name the crew.' })
  @MaxLength(60)
  name: string;

  @ApiProperty({ format: 'uuid', description: 'A crew lead of the branch' })
  @IsUUID('all', { message: 'Choose the crew lead.' })
  leadUserId: string;

  @ApiPropertyOptional()
  @IsOptional()
  @IsBoolean()
  active?: boolean;

  @ApiProperty({ type: [CrewMemberDto] })
  @IsArray()
  @ArrayMaxSize(30)
  @ValidateNested({ each: true })
  @Type(() => CrewMemberDto)
  members: CrewMemberDto[];
}

export class UpdateCrewDto extends PartialType(CrewDto) {}

export class BranchQueryDto {
  @ApiPropertyOptional({ format: 'uuid' })
  @IsOptional()
  @IsUUID('all', { message: 'Unknown branch.' })
  branchId?: string;
}

export class JobListQueryDto extends BranchQueryDto {
  @ApiPropertyOptional({ description: 'Comma-separated statuses' })
  @IsOptional()
  @Matches(/^[a-z_]+(,[a-z_]+)*$/, { message: 'Unknown status.' })
  @MaxLength(80)
  status?: string;

  @IsOptional() @IsUUID('all', { message: 'Unknown crew.' }) crewId?: string;
  @IsOptional() @IsUUID('all', { message: 'Unknown salesperson.' }) salespersonId?: string;
  @IsOptional() @CalendarDate('From') from?: string;
  @IsOptional() @CalendarDate('To') to?: string;
  @IsOptional() @IsString() @MaxLength(100) q?: string;
  @IsOptional() @Matches(/^\d{1,6}$/) page?: string;
  @IsOptional()
  @Matches(/^(10|25|50|100)$/, { message: 'Page size is 10, 25, 50 or 100.' })
  pageSize?: string;
}

export class CalendarQueryDto extends BranchQueryDto {
  @ApiProperty({ example: '2026-07-13' })
  @CalendarDate('From')
  from: string;

  @ApiProperty({ example: '2026-07-26' })
  @CalendarDate('To')
  to: string;
}

export class ScheduleJobDto implements ScheduleJobInput {
  @ApiProperty({ format: 'uuid' })
  @IsUUID('all', { message: 'Choose a crew.' })
  crewId: string;

  @ApiProperty({ example: '2026-07-20' })
  @CalendarDate('Start day')
  startOn: string;

  @ApiProperty({ minimum: 1, maximum: 30, example: 2 })
  @IsInt({ message: 'Days on site: a whole number.' })
  @Min(1, { message: 'At least 1 day on site.' })
  @Max(30, { message: 'At most 30 days on site.' })
  durationDays: number;
}

export class WaiveWindowDto implements WaiveWindowInput {
  @ApiProperty({
    description:
      'The homeowner’s own separate, signed and dated statement describing the emergency and waiving the right to cancel (16 CFR 429.1(e)), as written',
  })
  @Transform(trim)
  @IsString()
  @MinLength(20, {
    message:
      'Copy the homeowner’s own signed and dated statement describing the emergency (16 CFR 429.1(e)).',
  })
  @MaxLength(2000)
  note: string;
}

export class PermitDto implements PermitInput {
  @ApiProperty({ nullable: true, description: 'null: not known yet' })
  @ValidateIf((_o, v) => v !== null)
  @IsBoolean({ message: 'Needed: yes, no, or not known yet.' })
  needed: boolean | null;

  @IsOptional() @ValidateIf((_o, v) => v !== null) @CalendarDate('Applied on') appliedOn?: string | null;

  @ApiPropertyOptional({ example: 'BLD-26-01234' })
  @IsOptional()
  @Transform(emptyToNull)
  @ValidateIf((_o, v) => v !== null)
  @IsString()
  @MaxLength(60)
  number?: string | null;

  @IsOptional() @ValidateIf((_o, v) => v !== null) @CalendarDate('Issued on') issuedOn?: string | null;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @CalendarDate('Inspection passed on')
  inspectionPassedOn?: string | null;
}

export class LocateDto implements LocateInput {
  @ApiProperty({ example: '326110001' })
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'Enter the 811 ticket number.' })
  @MaxLength(60)
  ticketNumber: string;

  @ApiProperty({ example: '2026-07-14' })
  @CalendarDate('Filed on')
  filedOn: string;

  @ApiPropertyOptional({ description: 'Defaults to the state pack’s rule where it has one' })
  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @CalendarDate('Expires on')
  expiresOn?: string | null;
}
