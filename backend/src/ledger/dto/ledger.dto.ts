import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import {
  IsIn,
  IsISO8601,
  IsOptional,
  IsString,
  IsUUID,
  Matches,
  MaxLength,
  MinLength,
} from 'class-validator';
import type { ReverseEntryRequest } from '@loambook/common';

const trim = ({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value);
const DAY = /^\d{4}-\d{2}-\d{2}$/;
const dayMessage = { message: 'A date like 2026-12-31.' };
const FORMATS = ['json', 'csv'] as const;

/** A calendar date: the shape and a real day (2026-02-30 is refused). */
function Day(): PropertyDecorator {
  return (target, key) => {
    IsOptional()(target, key);
    Matches(DAY, dayMessage)(target, key);
    IsISO8601({ strict: true }, dayMessage)(target, key);
  };
}

export class JournalQueryDto {
  @ApiPropertyOptional() @IsOptional() @IsUUID('all', { message: 'Unknown branch.' }) branchId?: string;
  @ApiPropertyOptional({ example: '2026-12-01' }) @Day() from?: string;
  @ApiPropertyOptional({ example: '2026-12-31' }) @Day() to?: string;
  @ApiPropertyOptional({ example: 'deposit.card' })
  @IsOptional()
  @Matches(/^[a-z][a-z_]*([.][a-z_]+)*$/, { message: 'Unknown reason.' })
  @MaxLength(64)
  reasonCode?: string;
  @ApiPropertyOptional()
  @IsOptional()
  @Matches(/^[1-9]\d{0,5}$/, { message: 'A page number.' })
  page?: string;
  @ApiPropertyOptional()
  @IsOptional()
  @Matches(/^(10|25|50|100)$/, { message: 'Page size is 10, 25, 50 or 100.' })
  pageSize?: string;
  @ApiPropertyOptional({ enum: FORMATS }) @IsOptional() @IsIn(FORMATS) format?: (typeof FORMATS)[number];
}

export class AccountsQueryDto {
  @ApiProperty() @IsUUID('all', { message: 'Choose a branch.' }) branchId: string;
}

export class AccountLinesQueryDto {
  @ApiPropertyOptional({ example: '2026-12-01' }) @Day() from?: string;
  @ApiPropertyOptional({ example: '2026-12-31' }) @Day() to?: string;
  @ApiPropertyOptional()
  @IsOptional()
  @Matches(/^[1-9]\d{0,5}$/, { message: 'A page number.' })
  page?: string;
  @ApiPropertyOptional()
  @IsOptional()
  @Matches(/^(50|100|250|500)$/, { message: 'Page size is 50, 100, 250 or 500.' })
  pageSize?: string;
  @ApiPropertyOptional({ enum: FORMATS }) @IsOptional() @IsIn(FORMATS) format?: (typeof FORMATS)[number];
}

export class TrialBalanceQueryDto {
  @ApiPropertyOptional({ description: 'One branch; every branch you may see when left out' })
  @IsOptional()
  @IsUUID('all', { message: 'Unknown branch.' })
  branchId?: string;
  @ApiPropertyOptional({ example: '2026-12-31', description: 'Defaults to today' }) @Day() asOf?: string;
  @ApiPropertyOptional({ enum: FORMATS }) @IsOptional() @IsIn(FORMATS) format?: (typeof FORMATS)[number];
}

export class ReverseEntryDto implements ReverseEntryRequest {
  @ApiProperty({ example: 'Posted to the wrong branch' })
  @Transform(trim)
  @IsString()
  @MinLength(3, { message: 'Say why the entry is reversed.' })
  @MaxLength(300)
  reason: string;
}
