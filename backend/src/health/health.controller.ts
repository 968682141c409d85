import { Controller, Get, Inject } from '@nestjs/common';
import { ApiTags } from '@nestjs/swagger';
import type { Knex } from 'knex';
import type { HealthResponse } from '@loambook/common';
import { Public } from '../common/decorators';
import { KNEX } from '../database/database.module';

@ApiTags('health')
@Controller('health')
export class HealthController {
  constructor(@Inject(KNEX) private readonly knex: Knex) {}

  @Public()
  @Get()
  async health(): Promise<HealthResponse> {
    try {
      await this.knex.raw('select 1');
      return { status: 'ok', db: 'up' };
    } catch {
      return { status: 'degraded', db: 'down' };
    }
  }
}
