import { Global, Inject, Module, type OnApplicationShutdown } from '@nestjs/common';
import knex, { type Knex } from 'knex';
import { APP_CONFIG, type AppConfig } from '../config/config';
import { knexConfig } from './knex-config';

export const KNEX = Symbol('KNEX');

@Global()
@Module({
  providers: [
    {
      provide: KNEX,
      inject: [APP_CONFIG],
      useFactory: (config: AppConfig): Knex => knex(knexConfig(config.database)),
    },
  ],
  exports: [KNEX],
})
export class DatabaseModule implements OnApplicationShutdown {
  constructor(@Inject(KNEX) private readonly db: Knex) {}

  async onApplicationShutdown(): Promise<void> {
    await this.db.destroy();
  }
}
