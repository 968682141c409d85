import { Module } from '@nestjs/common';
import { BranchesModule } from '../branches/branches.module';
import { LeadsController } from './leads.controller';
import { LeadsRepository } from './leads.repository';
import { LeadsService } from './leads.service';

@Module({
  imports: [BranchesModule],
  controllers: [LeadsController],
  providers: [LeadsRepository, LeadsService],
  exports: [LeadsService, LeadsRepository],
})
export class LeadsModule {}
