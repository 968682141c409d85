import { ApiProperty, ApiPropertyOptional, PartialType, OmitType } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import {
  IsEmail,
  IsIn,
  IsInt,
  IsOptional,
  IsString,
  IsUUID,
  Matches,
  Max,
  MaxLength,
  Min,
  MinLength,
} from 'class-validator';
import {
  FOUNDATION_TYPES,
  LEAD_STAGES,
  MANUAL_ACTIVITY_KINDS,
  PREFERRED_CONTACTS,
  US_STATES,
  type FoundationType,
  type LeadStage,
  type ManualActivityKind,
  type PreferredContact,
} from '@loambook/common';

const trim = ({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value);
const emptyToNull = ({ value }: { value: unknown }) =>
  typeof value === 'string' ? value.trim() || null : value;
const PHONE = /^[0-9+()\-. ]{7,32}$/;
const MONEY = /^\d{1,12}(\.\d{1,2})?$/;

export class CreateLeadDto {
  @ApiProperty()
  @IsUUID('all', { message: 'Choose a branch.' })
  branchId: string;

  @ApiPropertyOptional({ description: 'Defaults to the salesperson entering the lead' })
  @IsOptional()
  @IsUUID('all', { message: 'Unknown salesperson.' })
  salespersonId?: string | null;

  @ApiProperty({ example: 'Marisol Ebbing' })
  @Transform(trim)
  @IsString()
  @MinLength(2, { message: 'Enter the homeowner’s name.' })
  @MaxLength(120)
  homeownerName: string;

  @ApiPropertyOptional({ example: '555-0134' })
  @IsOptional()
  @Transform(emptyToNull)
  @Matches(PHONE, { message: 'Enter a phone number (digits, spaces, dashes).' })
  phonePrimary?: string | null;

  @ApiPropertyOptional()
  @IsOptional()
  @Transform(emptyToNull)
  @Matches(PHONE, { message: 'Enter a phone number (digits, spaces, dashes).' })
  phoneSecondary?: string | null;

  @ApiPropertyOptional()
  @IsOptional()
  @Transform(emptyToNull)
  @IsEmail({}, { message: 'Enter a valid e-mail address.' })
  @MaxLength(254)
  email?: string | null;

  @ApiProperty({ enum: PREFERRED_CONTACTS })
  @IsIn(PREFERRED_CONTACTS, { message: 'Choose how the homeowner prefers to be contacted.' })
  preferredContact: PreferredContact;

  @ApiProperty()
  @Transform(trim)
  @IsString()
  @MinLength(3, { message: 'Enter the street address.' })
  @MaxLength(120)
  addressLine1: string;

  @ApiProperty()
  @Transform(trim)
  @IsString()
  @MinLength(2, { message: 'Enter the city.' })
  @MaxLength(80)
  city: string;

  @ApiProperty({ example: 'FL' })
  @IsIn(US_STATES, { message: 'Choose a US state.' })
  state: string;

  @ApiProperty({ example: '32901' })
  @Matches(/^\d{5}(-\d{4})?$/, { message: 'Enter a 5-digit ZIP code (or ZIP+4).' })
  postalCode: string;

  @ApiPropertyOptional({ example: 1978 })
  @IsOptional()
  @IsInt({ message: 'Enter the year as four digits.' })
  @Min(1700, { message: 'Enter a year after 1700.' })
  @Max(2100)
  yearBuilt?: number | null;

  @ApiPropertyOptional({ enum: FOUNDATION_TYPES })
  @IsOptional()
  @IsIn(FOUNDATION_TYPES, { message: 'Choose a foundation type.' })
  foundationType?: FoundationType | null;

  @ApiPropertyOptional({ example: 'Referral' })
  @IsOptional()
  @IsString()
  @MaxLength(80)
  source?: string | null;

  @ApiPropertyOptional()
  @IsOptional()
  @IsString()
  @MaxLength(4000)
  notes?: string | null;
}

export class UpdateLeadDto extends PartialType(OmitType(CreateLeadDto, ['branchId'] as const)) {}

export class DuplicateCheckDto {
  @IsOptional() @IsString() @MaxLength(120) addressLine1?: string;
  @IsOptional() @IsString() @MaxLength(10) postalCode?: string;
  @IsOptional() @IsString() @MaxLength(32) phone?: string;
  @IsOptional() @IsString() @MaxLength(254) email?: string;
  @IsOptional() @IsUUID() excludeId?: string;
}

export class LeadActivityDto {
  @ApiProperty({ enum: MANUAL_ACTIVITY_KINDS })
  @IsIn(MANUAL_ACTIVITY_KINDS, { message: 'Choose call, visit, note or e-mail.' })
  kind: ManualActivityKind;

  @ApiProperty()
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'Write what happened.' })
  @MaxLength(4000)
  body: string;
}

export class ChangeStageDto {
  @ApiProperty({ enum: LEAD_STAGES })
  @IsIn(LEAD_STAGES, { message: 'Unknown stage.' })
  to: LeadStage;

  @ApiPropertyOptional({ description: 'Required when marking a lead lost' })
  @IsOptional()
  @IsString()
  @MaxLength(500)
  reason?: string;
}

export class TransferLeadDto {
  @ApiProperty()
  @IsUUID('all', { message: 'Choose the branch to transfer to.' })
  branchId: string;

  @ApiPropertyOptional()
  @IsOptional()
  @IsString()
  @MaxLength(1000)
  note?: string;
}

export const PIPELINE_SORTS = ['age', 'daysInStage', 'value', 'homeowner', 'stage'] as const;

export class PipelineQueryDto {
  @IsOptional() @IsUUID('all', { message: 'Unknown branch.' }) branchId?: string;
  @ApiPropertyOptional({ description: 'Comma-separated stages' })
  @IsOptional()
  @Matches(/^[a-z_]+(,[a-z_]+)*$/, { message: 'Unknown stage.' })
  stage?: string;
  @IsOptional() @IsUUID('all', { message: 'Unknown salesperson.' }) salespersonId?: string;
  @IsOptional() @Matches(/^\d{1,5}$/, { message: 'Whole days.' }) minAgeDays?: string;
  @IsOptional() @Matches(/^\d{1,5}$/, { message: 'Whole days.' }) maxAgeDays?: string;
  @IsOptional() @Matches(MONEY, { message: 'An amount like 2500 or 2500.00.' }) minValue?: string;
  @IsOptional() @Matches(MONEY, { message: 'An amount like 2500 or 2500.00.' }) maxValue?: string;
  @IsOptional() @IsString() @MaxLength(100) q?: string;
  @IsOptional() @IsIn(['true', 'false']) approvalPending?: string;
  @IsOptional() @IsIn(PIPELINE_SORTS) sort?: (typeof PIPELINE_SORTS)[number];
  @IsOptional() @IsIn(['asc', 'desc']) order?: 'asc' | 'desc';
  @IsOptional() @Matches(/^\d{1,6}$/) page?: string;
  @IsOptional()
  @Matches(/^(10|25|50|100)$/, { message: 'Page size is 10, 25, 50 or 100.' })
  pageSize?: string;
}
