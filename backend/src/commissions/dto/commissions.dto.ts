import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform, Type } from 'class-transformer';
import {
  ArrayMaxSize,
  IsArray,
  IsBoolean,
  IsIn,
  IsISO8601,
  IsObject,
  IsOptional,
  IsString,
  IsUUID,
  Matches,
  MaxLength,
  MinLength,
  ValidateIf,
  ValidateNested,
} from 'class-validator';
import type {
  CommissionPlanBasis,
  CommissionPlanInput,
  CommissionPlanPatch,
  CommissionRate,
  CommissionStatementStatus,
  PayStatementInput,
  SetCommissionSplitsInput,
} from '@loambook/common';

const trim = ({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value);
const DAY = /^\d{4}-\d{2}-\d{2}$/;
const dayMessage = { message: 'A date like 2026-12-31.' };

/** A calendar date: the shape and a real day (2026-02-30 is refused). */
function Day(optional: boolean): PropertyDecorator {
  return (target, key) => {
    if (optional) IsOptional()(target, key);
    Matches(DAY, dayMessage)(target, key);
    IsISO8601({ strict: true }, dayMessage)(target, key);
  };
}

// Value rules (basis, percentages, tiers) are the commission rules' own (validateCommissionPlan), answered
// as 422 with the field at fault; the DTOs only check the shapes.

export class CreateCommissionPlanDto implements CommissionPlanInput {
  @ApiPropertyOptional({ description: 'A branch, or null for the company-wide default', nullable: true })
  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsUUID('all', { message: 'Choose a branch, or none for the company-wide default.' })
  branchId?: string | null;

  @ApiProperty({ example: 'Standard 2027' })
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'Give the plan a name.' })
  @MaxLength(80)
  name: string;

  @ApiProperty({ enum: ['net_price', 'gross_margin'] })
  @IsString()
  @MaxLength(20)
  basis: CommissionPlanBasis;

  @ApiProperty({ example: { kind: 'flat', ratePct: '8' } })
  @IsObject({ message: 'The rate is flat or tiered.' })
  rate: CommissionRate;

  @ApiProperty({ example: '50' })
  @IsString({ message: 'A percentage such as "50".' })
  @MaxLength(12)
  firstMilestonePct: string;

  @ApiProperty({ example: '2027-01-01' })
  @Day(false)
  effectiveFrom: string;

  @ApiPropertyOptional({ default: true })
  @IsOptional()
  @IsBoolean()
  active?: boolean;
}

export class UpdateCommissionPlanDto implements CommissionPlanPatch {
  @ApiPropertyOptional({ nullable: true })
  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsUUID('all', { message: 'Choose a branch, or none for the company-wide default.' })
  branchId?: string | null;

  @ApiPropertyOptional()
  @IsOptional()
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'Give the plan a name.' })
  @MaxLength(80)
  name?: string;

  @ApiPropertyOptional({ enum: ['net_price', 'gross_margin'] })
  @IsOptional()
  @IsString()
  @MaxLength(20)
  basis?: CommissionPlanBasis;

  @ApiPropertyOptional()
  @IsOptional()
  @IsObject({ message: 'The rate is flat or tiered.' })
  rate?: CommissionRate;

  @ApiPropertyOptional()
  @IsOptional()
  @IsString({ message: 'A percentage such as "50".' })
  @MaxLength(12)
  firstMilestonePct?: string;

  @ApiPropertyOptional()
  @Day(true)
  effectiveFrom?: string;

  @ApiPropertyOptional()
  @IsOptional()
  @IsBoolean()
  active?: boolean;
}

export class SplitShareDto {
  @ApiProperty()
  @IsUUID('all', { message: 'Choose a salesperson.' })
  salespersonId: string;

  @ApiProperty({ example: '50' })
  @IsString({ message: 'A share such as "50" or "33.34".' })
  @MaxLength(12)
  sharePct: string;
}

export class SetCommissionSplitsDto implements SetCommissionSplitsInput {
  @ApiProperty({ type: [SplitShareDto] })
  @IsArray()
  @ArrayMaxSize(10, { message: 'At most 10 salespeople share a contract.' })
  @ValidateNested({ each: true })
  @Type(() => SplitShareDto)
  splits: SplitShareDto[];
}

const STATUSES: CommissionStatementStatus[] = ['draft', 'approved', 'paid'];

export class StatementsQueryDto {
  @ApiPropertyOptional() @IsOptional() @IsUUID('all', { message: 'Unknown branch.' }) branchId?: string;
  @ApiPropertyOptional()
  @IsOptional()
  @IsUUID('all', { message: 'Unknown salesperson.' })
  salespersonId?: string;
  @ApiPropertyOptional({ example: '2026-07-01', description: 'Any day of the pay period' })
  @Day(true)
  period?: string;
  @ApiPropertyOptional({ enum: STATUSES }) @IsOptional() @IsIn(STATUSES) status?: CommissionStatementStatus;
}

export class BuildStatementsQueryDto {
  @ApiProperty({ example: '2026-07-15', description: 'Any day of the pay period to build up to' })
  @Day(false)
  period: string;
}

export class PayStatementDto implements PayStatementInput {
  @ApiProperty({ example: '2026-07-20' })
  @Day(false)
  paidOn: string;

  @ApiPropertyOptional({ example: 'Cheque 1042' })
  @IsOptional()
  @Transform(trim)
  @IsString()
  @MaxLength(120)
  reference?: string;
}
