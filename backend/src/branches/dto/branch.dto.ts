import { ApiProperty, PartialType } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import { IsIn, IsOptional, IsString, Matches, MaxLength, MinLength, ValidateNested } from 'class-validator';
import {
  BRANCH_CODE_PATTERN,
  PERCENT_PATTERN,
  SALES_TAX_TREATMENTS,
  US_STATES,
  type BranchInput,
  type DiscountAuthority,
  type SalesTaxTreatment,
} from '@loambook/common';

const PERCENT_MESSAGE = 'Enter a percentage from 0 to 100, with at most two decimals, as text (e.g. "12.5").';

export class DiscountAuthorityDto implements DiscountAuthority {
  @ApiProperty({ example: '10' })
  @IsString()
  @Matches(PERCENT_PATTERN, { message: PERCENT_MESSAGE })
  salesperson: string;

  @ApiProperty({ example: '20' })
  @IsString()
  @Matches(PERCENT_PATTERN, { message: PERCENT_MESSAGE })
  branch_manager: string;
}

export class CreateBranchDto implements BranchInput {
  @ApiProperty({ example: 'MRW', description: '2–8 capital letters or digits, starting with a letter' })
  @IsString()
  @Matches(BRANCH_CODE_PATTERN, { message: 'Use 2 to 8 capital letters or digits, starting with a letter.' })
  code: string;

  @ApiProperty({ example: 'Marrowfield' })
  @IsString()
  @MinLength(2, { message: 'Enter the branch name.' })
  @MaxLength(80)
  name: string;

  @ApiProperty()
  @IsString()
  @MinLength(3, { message: 'Enter the street address.' })
  @MaxLength(120)
  addressLine1: string;

  @ApiProperty()
  @IsString()
  @MinLength(2, { message: 'Enter the city.' })
  @MaxLength(80)
  city: string;

  @ApiProperty({ example: 'FL' })
  @IsIn(US_STATES, { message: 'Choose a US state.' })
  state: string;

  @ApiProperty({ example: '32999' })
  @IsString()
  @Matches(/^\d{5}(-\d{4})?$/, { message: 'Enter a 5-digit ZIP code (or ZIP+4).' })
  postalCode: string;

  @ApiProperty({ required: false, nullable: true, example: '555-0100' })
  @IsOptional()
  @IsString()
  @MaxLength(32)
  phone: string | null;

  @ApiProperty({ example: 'America/New_York' })
  @IsString()
  @MaxLength(64)
  timezone: string;

  @ApiProperty({ example: '35', description: 'Lowest gross margin a proposal may carry without approval, %' })
  @IsString()
  @Matches(PERCENT_PATTERN, { message: PERCENT_MESSAGE })
  marginFloorPct: string;

  @ApiProperty({ type: DiscountAuthorityDto })
  @ValidateNested()
  @Type(() => DiscountAuthorityDto)
  discountAuthority: DiscountAuthorityDto;

  @ApiProperty({ enum: SALES_TAX_TREATMENTS })
  @IsIn(SALES_TAX_TREATMENTS, { message: 'Choose how sales tax is handled.' })
  salesTaxTreatment: SalesTaxTreatment;

  @ApiProperty({ example: '7' })
  @IsString()
  @Matches(PERCENT_PATTERN, { message: PERCENT_MESSAGE })
  salesTaxRatePct: string;
}

export class UpdateBranchDto extends PartialType(CreateBranchDto) {}
