import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import {
  ArrayMaxSize,
  Equals,
  IsArray,
  IsEmail,
  IsOptional,
  IsString,
  IsUUID,
  Matches,
  MaxLength,
  MinLength,
} from 'class-validator';
import {
  SIGNATURE_MAX_BYTES,
  SIGNER_NAME_MAX_LENGTH,
  UNIT_AMOUNT_PATTERN,
  type CancelContractRequest,
  type CancelSigningRequest,
  type SendProposalRequest,
  type SignContractRequest,
  type SignInPersonRequest,
} from '@loambook/common';

const trim = ({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value);
/** The data URL of the largest signature accepted: base64 is 4/3 of the bytes, plus the prefix. */
const SIGNATURE_MAX_CHARS = Math.ceil(SIGNATURE_MAX_BYTES / 3) * 4 + 64;
const DEPOSIT_MESSAGE = 'Enter the deposit in dollars with at most two decimals, as text (e.g. "1500.00").';

export class SendProposalDto implements SendProposalRequest {
  @ApiPropertyOptional({
    description: 'Send to this address instead of the lead’s e-mail',
    example: 'dana@example.com',
  })
  @IsOptional()
  @Transform(trim)
  @IsEmail({}, { message: 'Enter a valid e-mail address.' })
  @MaxLength(254)
  email?: string;

  @ApiPropertyOptional({
    description: 'Deposit the contract asks for, dollars; at most the lowest option’s total',
    example: '1500.00',
  })
  @IsOptional()
  @IsString()
  @MaxLength(13)
  @Matches(UNIT_AMOUNT_PATTERN, { message: DEPOSIT_MESSAGE })
  depositAmount?: string;
}

export class SignContractDto implements SignContractRequest {
  @ApiProperty({ format: 'uuid' })
  @IsUUID('all', { message: 'Choose one of the options.' })
  optionId: string;

  @ApiProperty({ example: 'Dana Example' })
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'Type your full name.' })
  @MaxLength(SIGNER_NAME_MAX_LENGTH)
  signerName: string;

  @ApiProperty({ description: 'data:image/png;base64,… — a PNG of at most 500 KB' })
  @IsString()
  @MaxLength(SIGNATURE_MAX_CHARS, { message: 'The signature image is too large: at most 500 KB.' })
  signaturePng: string;

  @ApiProperty({ type: [String], example: ['FTC_429', 'FL_713_015', 'FL_489_1425'] })
  @IsArray()
  @ArrayMaxSize(20)
  @IsString({ each: true })
  @MaxLength(40, { each: true })
  acknowledgedNotices: string[];
}

export class SignInPersonDto extends SignContractDto implements SignInPersonRequest {
  @ApiPropertyOptional({
    description: 'Default: the deposit the proposal was last sent with, else none',
    example: '1500.00',
  })
  @IsOptional()
  @IsString()
  @MaxLength(13)
  @Matches(UNIT_AMOUNT_PATTERN, { message: DEPOSIT_MESSAGE })
  depositAmount?: string;
}

export class CancelSigningDto implements CancelSigningRequest {
  @ApiProperty({ enum: [true] })
  @Equals(true, { message: 'Confirm that you want to cancel the contract.' })
  confirm: true;
}

export class CancelContractDto implements CancelContractRequest {
  @ApiProperty({ example: 'Homeowner phoned on 2026-07-06 and mailed the signed form the same day.' })
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'Say how the homeowner cancelled (and, after the window, why it is accepted).' })
  @MaxLength(2000)
  note: string;
}
