import { ApiProperty, ApiPropertyOptional, PartialType } from '@nestjs/swagger';
import { IsBoolean, IsIn, IsOptional, IsString, Matches, MaxLength, MinLength } from 'class-validator';
import {
  PRICE_BOOK_CATEGORIES,
  PRICE_BOOK_CODE_PATTERN,
  PRICE_BOOK_UNITS,
  UNIT_AMOUNT_PATTERN,
  type CreatePriceBookItemRequest,
  type PriceBookCategory,
  type PriceBookUnit,
} from '@loambook/common';

const AMOUNT_MESSAGE = 'Enter an amount of 0 or more with at most two decimals, as text (e.g. "11.50").';

export class CreatePriceBookItemDto implements CreatePriceBookItemRequest {
  @ApiProperty({ example: 'PU-LB', description: 'Capital letters, digits and hyphens, up to 24' })
  @IsString()
  @MaxLength(24)
  @Matches(PRICE_BOOK_CODE_PATTERN, {
    message: 'Use up to 24 capital letters, digits or hyphens, starting with a letter or digit.',
  })
  code: string;

  @ApiProperty({ example: 'Polyurethane injection material, per lb' })
  @IsString()
  @MinLength(2, { message: 'Describe the item.' })
  @MaxLength(200)
  description: string;

  @ApiProperty({ enum: PRICE_BOOK_CATEGORIES })
  @IsIn(PRICE_BOOK_CATEGORIES, { message: 'Choose a category from the list.' })
  category: PriceBookCategory;

  @ApiProperty({ enum: PRICE_BOOK_UNITS })
  @IsIn(PRICE_BOOK_UNITS, { message: 'Choose a unit from the list.' })
  unit: PriceBookUnit;

  @ApiProperty({ example: '5.20' })
  @IsString()
  @MaxLength(13)
  @Matches(UNIT_AMOUNT_PATTERN, { message: AMOUNT_MESSAGE })
  unitCost: string;

  @ApiProperty({ example: '11.50' })
  @IsString()
  @MaxLength(13)
  @Matches(UNIT_AMOUNT_PATTERN, { message: AMOUNT_MESSAGE })
  unitPrice: string;

  @ApiPropertyOptional({ default: true })
  @IsOptional()
  @IsBoolean()
  active?: boolean;
}

export class UpdatePriceBookItemDto extends PartialType(CreatePriceBookItemDto) {}

export class PriceBookQueryDto {
  @ApiPropertyOptional({ enum: ['true', 'false'], description: 'Include deactivated items' })
  @IsOptional()
  @IsIn(['true', 'false'])
  includeInactive?: 'true' | 'false';
}
