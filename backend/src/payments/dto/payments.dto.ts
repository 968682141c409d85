import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import { IsIn, IsISO8601, IsOptional, IsString, IsUUID, Matches, MaxLength } from 'class-validator';
import {
  PAYMENT_KINDS,
  PAYMENT_METHODS,
  RECORDED_METHODS,
  type CreatePaymentLinkRequest,
  type PaymentKind,
  type PaymentMethod,
  type RecordedMethod,
  type RecordPaymentRequest,
  type RefundRequest,
} from '@loambook/common';

const trim = ({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value);
/** Dollars with at most two decimals, as text: "1500", "1500.5", "1500.50". */
const AMOUNT = /^\d{1,9}(\.\d{1,2})?$/;
const AMOUNT_MESSAGE = {
  message: 'Enter an amount in dollars with at most two decimals, as text (e.g. "1500.00").',
};
const DAY = /^\d{4}-\d{2}-\d{2}$/;
const DAY_MESSAGE = { message: 'A date like 2026-12-31.' };

export class CreatePaymentLinkDto implements CreatePaymentLinkRequest {
  @ApiProperty({ enum: PAYMENT_KINDS })
  @IsIn(PAYMENT_KINDS, { message: 'Choose deposit or balance.' })
  kind: PaymentKind;

  @ApiPropertyOptional({
    example: '1000.00',
    description: 'Default: the contract’s deposit, or the balance due',
  })
  @IsOptional()
  @IsString(AMOUNT_MESSAGE)
  @MaxLength(13)
  @Matches(AMOUNT, AMOUNT_MESSAGE)
  amount?: string;
}

export class RecordPaymentDto implements RecordPaymentRequest {
  @ApiProperty({ enum: PAYMENT_KINDS })
  @IsIn(PAYMENT_KINDS, { message: 'Choose deposit or balance.' })
  kind: PaymentKind;

  @ApiProperty({ enum: RECORDED_METHODS })
  @IsIn(RECORDED_METHODS, { message: 'Choose cash, cheque or transfer.' })
  method: RecordedMethod;

  @ApiProperty({ example: '1000.00' })
  @IsString(AMOUNT_MESSAGE)
  @MaxLength(13)
  @Matches(AMOUNT, AMOUNT_MESSAGE)
  amount: string;

  @ApiProperty({ example: '2026-12-03' })
  @IsString(DAY_MESSAGE)
  @Matches(DAY, DAY_MESSAGE)
  @IsISO8601({ strict: true }, DAY_MESSAGE)
  receivedOn: string;

  @ApiPropertyOptional({ example: 'Cheque 1042' })
  @IsOptional()
  @Transform(trim)
  @IsString()
  @MaxLength(120, { message: 'At most 120 characters.' })
  reference?: string;

  @ApiPropertyOptional({ description: 'The screen’s id for this recording: the same id twice records once' })
  @IsOptional()
  @IsUUID('all', { message: 'A request id is a UUID.' })
  requestId?: string;
}

export class RefundDto implements RefundRequest {
  @ApiPropertyOptional({ example: '1000.00', description: 'Default: everything refundable' })
  @IsOptional()
  @IsString(AMOUNT_MESSAGE)
  @MaxLength(13)
  @Matches(AMOUNT, AMOUNT_MESSAGE)
  amount?: string;

  @ApiPropertyOptional({ example: 'Cancelled within the three-day window' })
  @IsOptional()
  @Transform(trim)
  @IsString()
  @MaxLength(500, { message: 'At most 500 characters.' })
  reason?: string;

  @ApiPropertyOptional()
  @IsOptional()
  @IsUUID('all', { message: 'A request id is a UUID.' })
  requestId?: string;
}

export class PaymentListQueryDto {
  @ApiPropertyOptional() @IsOptional() @IsUUID('all', { message: 'Unknown branch.' }) branchId?: string;

  @ApiPropertyOptional({ example: '2026-12-01' })
  @IsOptional()
  @Matches(DAY, DAY_MESSAGE)
  @IsISO8601({ strict: true }, DAY_MESSAGE)
  from?: string;

  @ApiPropertyOptional({ example: '2026-12-31' })
  @IsOptional()
  @Matches(DAY, DAY_MESSAGE)
  @IsISO8601({ strict: true }, DAY_MESSAGE)
  to?: string;

  @ApiPropertyOptional({ enum: PAYMENT_METHODS })
  @IsOptional()
  @IsIn(PAYMENT_METHODS, { message: 'Unknown method.' })
  method?: PaymentMethod;

  @ApiPropertyOptional({ enum: PAYMENT_KINDS })
  @IsOptional()
  @IsIn(PAYMENT_KINDS, { message: 'Unknown kind.' })
  kind?: PaymentKind;

  @ApiPropertyOptional()
  @IsOptional()
  @Matches(/^[1-9]\d{0,5}$/, { message: 'A page number.' })
  page?: string;

  @ApiPropertyOptional()
  @IsOptional()
  @Matches(/^(10|25|50|100)$/, { message: 'Page size is 10, 25, 50 or 100.' })
  pageSize?: string;
}
