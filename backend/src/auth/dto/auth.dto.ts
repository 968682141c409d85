import { ApiProperty } from '@nestjs/swagger';
import { IsEmail, IsString, MaxLength, MinLength } from 'class-validator';
import { PASSWORD_MAX_LENGTH, type LoginRequest, type SetPasswordRequest } from '@loambook/common';

export class LoginDto implements LoginRequest {
  @ApiProperty({ example: 'owner@loambook-demo.example.com' })
  @IsEmail({}, { message: 'Enter a valid e-mail address.' })
  @MaxLength(254)
  email: string;

  @ApiProperty()
  @IsString()
  @MinLength(1, { message: 'Enter your password.' })
  @MaxLength(PASSWORD_MAX_LENGTH)
  password: string;
}

export class SetPasswordDto implements SetPasswordRequest {
  @ApiProperty()
  @IsString()
  @MinLength(10)
  @MaxLength(200)
  token: string;

  @ApiProperty({ description: 'At least 12 characters.' })
  @IsString()
  @MaxLength(PASSWORD_MAX_LENGTH, { message: `Use at most ${PASSWORD_MAX_LENGTH} characters.` })
  password: string;
}
