import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import {
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
  ValidateIf,
} from 'class-validator';
import {
  MAX_MATCH_WINDOW_DAYS,
  type CreateBankAccountRequest,
  type CreateMatchRequest,
  type LockPeriodRequest,
  type MatchTargetKind,
} from '@loambook/common';

const trim = ({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value);
const DAY = /^\d{4}-\d{2}-\d{2}$/;
const dayMessage = { message: 'A date like 2026-12-31.' };

/** A calendar date: the shape and a real day (2026-02-30 is refused). */
function Day(optional = false): PropertyDecorator {
  return (target, key) => {
    if (optional) IsOptional()(target, key);
    Matches(DAY, dayMessage)(target, key);
    IsISO8601({ strict: true }, dayMessage)(target, key);
  };
}

/** "true" / "false" in a multipart field or a query string, a boolean in JSON. */
const toBoolean = ({ value }: { value: unknown }) =>
  value === 'true' ? true : value === 'false' ? false : value;

export class CreateBankAccountDto implements CreateBankAccountRequest {
  @ApiProperty({ example: 'Operating account' })
  @Transform(trim)
  @IsString()
  @MinLength(2, { message: 'Name the account (2 characters or more).' })
  @MaxLength(80)
  name: string;

  @ApiProperty({ example: '0142', description: 'The last four digits of the account number' })
  @Transform(trim)
  @IsString()
  @Matches(/^[0-9]{4}$/, { message: 'The last four digits of the account number.' })
  last4: string;

  @ApiPropertyOptional({ nullable: true, description: 'Left out or null: a company-wide account' })
  @IsOptional()
  @IsUUID('all', { message: 'Unknown branch.' })
  branchId?: string | null;

  @ApiPropertyOptional({ default: true, description: 'Processor payouts arrive on this account' })
  @IsOptional()
  @IsBoolean()
  receivesPayouts?: boolean;
}

export class StatementsQueryDto {
  @ApiPropertyOptional()
  @IsOptional()
  @IsUUID('all', { message: 'Unknown bank account.' })
  bankAccountId?: string;
}

export class AccountQueryDto {
  @ApiProperty() @IsUUID('all', { message: 'Choose the bank account.' }) bankAccountId: string;
}

/** The fields that come with a preview: multipart fields, or the query string of a text/csv body. */
export class PreviewStatementDto {
  @ApiPropertyOptional({
    description: 'Offers the account’s saved mapping and spots a file already uploaded',
  })
  @IsOptional()
  @IsUUID('all', { message: 'Unknown bank account.' })
  bankAccountId?: string;

  @ApiPropertyOptional({ description: 'A text/csv body has no file name: give it here' })
  @IsOptional()
  @IsString()
  @MaxLength(255)
  fileName?: string;

  @ApiPropertyOptional({
    description: 'A mapping (JSON) to read the file with; its result comes back in check',
  })
  @IsOptional()
  @IsString()
  @MaxLength(2000)
  mapping?: string;
}

export class UploadStatementDto {
  @ApiProperty() @IsUUID('all', { message: 'Choose the bank account.' }) bankAccountId: string;

  @ApiProperty({
    description:
      'The column mapping as JSON: {"hasHeaderRow":true,"dateColumn":0,"descriptionColumn":1,' +
      '"amount":{"kind":"signed","column":2},"dateFormat":"MM/DD/YYYY"}',
  })
  @IsString()
  @MinLength(2, { message: 'Choose the columns.' })
  @MaxLength(2000)
  mapping: string;

  @ApiPropertyOptional({
    default: false,
    description:
      'true: store the valid rows and list the invalid ones as skipped; false: store nothing if any row is invalid',
  })
  @IsOptional()
  @Transform(toBoolean)
  @IsBoolean({ message: 'true or false.' })
  skipInvalidRows?: boolean;

  @ApiPropertyOptional({
    example: '2026-11-01',
    description: 'The statement period as the bank prints it; default: the first line’s date',
  })
  @Day(true)
  periodFrom?: string;

  @ApiPropertyOptional({ example: '2026-11-30', description: 'Default: the last line’s date' })
  @Day(true)
  periodTo?: string;
}

export class RangeQueryDto {
  @ApiProperty() @IsUUID('all', { message: 'Choose the bank account.' }) bankAccountId: string;
  @ApiProperty({ example: '2026-12-01' }) @Day() from: string;
  @ApiProperty({ example: '2026-12-31' }) @Day() to: string;
}

export class SuggestQueryDto extends RangeQueryDto {
  @ApiPropertyOptional({ default: 3, description: 'Days either side a bank line may be from its target' })
  @IsOptional()
  @Transform(({ value }) => (typeof value === 'string' && /^\d{1,3}$/.test(value) ? Number(value) : value))
  @IsInt({ message: 'A whole number of days.' })
  @Min(0)
  @Max(MAX_MATCH_WINDOW_DAYS)
  windowDays?: number;
}

const TARGET_KINDS: MatchTargetKind[] = ['payout', 'commission_payment', 'other'];

export class CreateMatchDto implements CreateMatchRequest {
  @ApiProperty() @IsUUID('all', { message: 'Choose a bank line.' }) bankLineId: string;

  @ApiProperty({ enum: TARGET_KINDS })
  @IsIn(TARGET_KINDS, { message: 'A payout, a commission payment, or other.' })
  targetKind: MatchTargetKind;

  @ApiPropertyOptional({ description: 'The payout’s or commission statement’s id (not for other)' })
  @ValidateIf((o: CreateMatchDto) => o.targetKind !== 'other' || o.targetId !== undefined)
  @IsUUID('all', { message: 'Choose what the line pays or receives.' })
  targetId?: string;

  @ApiPropertyOptional({ description: 'Why the line needs no match (required for other)' })
  @ValidateIf((o: CreateMatchDto) => o.targetKind === 'other' || o.note !== undefined)
  @Transform(trim)
  @IsString()
  @MinLength(3, { message: 'Say what the line is (3 characters or more).' })
  @MaxLength(300)
  note?: string;
}

export class LockPeriodDto implements LockPeriodRequest {
  @ApiProperty() @IsUUID('all', { message: 'Choose the bank account.' }) bankAccountId: string;
  @ApiProperty({ example: '2026-12-01' }) @Day() from: string;
  @ApiProperty({ example: '2026-12-31' }) @Day() to: string;
}
