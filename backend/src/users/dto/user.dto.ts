import { ApiProperty } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import {
  ArrayMaxSize,
  ArrayMinSize,
  ArrayUnique,
  IsArray,
  IsBoolean,
  IsEmail,
  IsIn,
  IsOptional,
  IsString,
  IsUUID,
  MaxLength,
  MinLength,
} from 'class-validator';
import { ROLES, type InviteUserRequest, type Role, type UpdateUserRequest } from '@loambook/common';

const trim = ({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value);

export class InviteUserDto implements InviteUserRequest {
  @ApiProperty({ example: 'Dana Okafor' })
  @Transform(trim)
  @IsString()
  @MinLength(2, { message: 'Enter the person’s name.' })
  @MaxLength(100, { message: 'Use at most 100 characters.' })
  name: string;

  @ApiProperty({ example: 'dana@loambook-demo.example.com' })
  @Transform(trim)
  @IsEmail({}, { message: 'Enter a valid e-mail address.' })
  @MaxLength(254)
  email: string;

  @ApiProperty({ enum: ROLES })
  @IsIn(ROLES, { message: 'Choose a role.' })
  role: Role;

  @ApiProperty({ type: [String], description: 'Branch ids; the owner and bookkeeper may have none' })
  @IsArray()
  @ArrayUnique()
  @ArrayMaxSize(50)
  @IsUUID('all', { each: true, message: 'Unknown branch.' })
  branchIds: string[];
}

export class UpdateUserDto implements UpdateUserRequest {
  @ApiProperty({ required: false })
  @IsOptional()
  @Transform(trim)
  @IsString()
  @MinLength(2, { message: 'Enter the person’s name.' })
  @MaxLength(100, { message: 'Use at most 100 characters.' })
  name?: string;

  @ApiProperty({ required: false, enum: ROLES })
  @IsOptional()
  @IsIn(ROLES, { message: 'Choose a role.' })
  role?: Role;

  @ApiProperty({ required: false, type: [String] })
  @IsOptional()
  @IsArray()
  @ArrayUnique()
  @ArrayMinSize(0)
  @ArrayMaxSize(50)
  @IsUUID('all', { each: true, message: 'Unknown branch.' })
  branchIds?: string[];

  @ApiProperty({ required: false, description: 'false deactivates: the person can no longer sign in' })
  @IsOptional()
  @IsBoolean()
  active?: boolean;
}
