import { IsOptional, IsUUID } from 'class-validator';

export class BranchFilterDto {
  @IsOptional()
  @IsUUID('all', { message: 'Unknown branch.' })
  branchId?: string;
}
