import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import {
  ArrayMaxSize,
  ArrayMinSize,
  IsArray,
  IsBoolean,
  IsIn,
  IsOptional,
  IsString,
  IsUUID,
  Matches,
  MaxLength,
  MinLength,
  ValidateNested,
} from 'class-validator';
import {
  APPROVAL_REQUEST_STATUSES,
  DISCOUNT_KINDS,
  QUANTITY_PATTERN,
  QUANTITY_SOURCES,
  UNIT_AMOUNT_PATTERN,
  type ApprovalRequestStatus,
  type CreateProposalRequest,
  type DecideApprovalRequest,
  type DiscountKind,
  type OptionDiscount,
  type ProposalLineRequest,
  type ProposalOptionRequest,
  type QuantitySource,
  type UpdateProposalRequest,
} from '@loambook/common';

/** Most options a proposal offers, and most lines an option has. */
export const MAX_OPTIONS = 6;
export const MAX_LINES = 40;

export class DiscountDto implements OptionDiscount {
  @ApiProperty({ enum: DISCOUNT_KINDS })
  @IsIn(DISCOUNT_KINDS, { message: 'Choose no discount, a percentage or an amount.' })
  kind: DiscountKind;

  @ApiProperty({ example: '5', description: 'Percent of list (0–100) or dollars; "0" for none' })
  @IsString()
  @MaxLength(13)
  @Matches(UNIT_AMOUNT_PATTERN, {
    message: 'Enter the discount as a number of 0 or more with at most two decimals, as text (e.g. "5").',
  })
  value: string;
}

export class ProposalLineDto implements ProposalLineRequest {
  @ApiProperty({ format: 'uuid' })
  @IsUUID('all', { message: 'Choose an item from the price book.' })
  priceBookItemId: string;

  @ApiProperty({ example: '240' })
  @IsString()
  @MaxLength(11)
  @Matches(QUANTITY_PATTERN, {
    message: 'Enter the quantity as a number with at most 3 decimals, as text (e.g. "12.5").',
  })
  @Matches(/[1-9]/, { message: 'The quantity must be more than 0.' })
  quantity: string;

  @ApiPropertyOptional({ enum: QUANTITY_SOURCES, default: 'typed' })
  @IsOptional()
  @IsIn(QUANTITY_SOURCES)
  quantitySource?: QuantitySource;
}

export class ProposalOptionDto implements ProposalOptionRequest {
  @ApiProperty({ example: 'Stabilise the east wall' })
  @IsString()
  @MinLength(1, { message: 'Give the option a title.' })
  @MaxLength(120)
  title: string;

  @ApiPropertyOptional({ nullable: true })
  @IsOptional()
  @IsString()
  @MaxLength(2000)
  description?: string | null;

  @ApiProperty({ type: DiscountDto })
  @ValidateNested()
  @Type(() => DiscountDto)
  discount: DiscountDto;

  @ApiProperty({ type: [ProposalLineDto] })
  @IsArray()
  @ArrayMinSize(1, { message: 'An option needs at least one line.' })
  @ArrayMaxSize(MAX_LINES)
  @ValidateNested({ each: true })
  @Type(() => ProposalLineDto)
  lines: ProposalLineDto[];
}

export class CreateProposalDto implements CreateProposalRequest {
  @ApiPropertyOptional({ format: 'uuid', nullable: true })
  @IsOptional()
  @IsUUID('all')
  inspectionId?: string | null;

  @ApiPropertyOptional({ nullable: true })
  @IsOptional()
  @IsString()
  @MaxLength(4000)
  notes?: string | null;

  @ApiProperty({ type: [ProposalOptionDto] })
  @IsArray()
  @ArrayMinSize(1, { message: 'A proposal needs at least one option.' })
  @ArrayMaxSize(MAX_OPTIONS)
  @ValidateNested({ each: true })
  @Type(() => ProposalOptionDto)
  options: ProposalOptionDto[];
}

export class UpdateProposalDto extends CreateProposalDto implements UpdateProposalRequest {
  @ApiPropertyOptional({
    default: false,
    description: 'true: every line takes today’s price book; false: items already quoted keep their price',
  })
  @IsOptional()
  @IsBoolean()
  refreshPrices?: boolean;
}

export class ApproveDto implements DecideApprovalRequest {
  @ApiPropertyOptional()
  @IsOptional()
  @IsString()
  @MaxLength(2000)
  note?: string;
}

export class RefuseDto implements DecideApprovalRequest {
  @ApiProperty({ description: 'Why it is refused: the salesperson reads it' })
  @IsString({ message: 'Say why the proposal is refused.' })
  @Matches(/\S/, { message: 'Say why the proposal is refused.' })
  @MaxLength(2000)
  note: string;
}

export class ApprovalsQueryDto {
  @ApiPropertyOptional({ enum: APPROVAL_REQUEST_STATUSES, default: 'pending' })
  @IsOptional()
  @IsIn(APPROVAL_REQUEST_STATUSES)
  status?: ApprovalRequestStatus;
}
