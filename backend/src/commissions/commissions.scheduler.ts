import {
  Inject,
  Injectable,
  Logger,
  type BeforeApplicationShutdown,
  type OnApplicationBootstrap,
} from '@nestjs/common';
import PgBoss from 'pg-boss';
import { APP_CONFIG, type AppConfig } from '../config/config';
import { CommissionsService } from './commissions.service';

/** The pg-boss queue (and schedule) of the earning check. */
export const EARNING_QUEUE = 'commissions-earning';
/** Where pg-boss keeps its tables, beside the application's in the same database. */
export const PGBOSS_SCHEMA = 'pgboss';

/**
 * Runs the commission earning check on a cron schedule with pg-boss, on the application's own PostgreSQL.
 * The schedule and the jobs live in the database (schema pgboss), so they survive a restart, and several
 * app instances coordinate through it: pg-boss lets one instance per interval turn due schedules into
 * jobs, a scheduled job is created at most once per minute slot (a singleton key and slot, both on
 * pg-boss's hand-over and on the job itself), and the queue's
 * 'singleton' policy lets only one earning job be active at a time. Every line is idempotent anyway (a
 * unique key per line and per ledger entry). COMMISSIONS_SCHEDULER=off leaves all of this out.
 */
@Injectable()
export class CommissionsScheduler implements OnApplicationBootstrap, BeforeApplicationShutdown {
  private readonly logger = new Logger('CommissionsScheduler');
  private boss: PgBoss | null = null;

  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly commissions: CommissionsService,
  ) {}

  get running(): boolean {
    return this.boss !== null;
  }

  async onApplicationBootstrap(): Promise<void> {
    if (!this.config.commissions.scheduler) return;
    await this.start();
  }

  async beforeApplicationShutdown(): Promise<void> {
    await this.stop();
  }

  async start(): Promise<void> {
    if (this.boss) return;
    const { database: db, commissions } = this.config;
    const poll = Math.min(45, Math.max(1, commissions.pollSeconds));
    const boss = new PgBoss({
      host: db.host,
      port: db.port,
      user: db.user,
      password: db.password,
      database: db.database,
      schema: PGBOSS_SCHEMA,
      application_name: 'loambook-commissions',
      max: 3,
      cronMonitorIntervalSeconds: poll,
      cronWorkerIntervalSeconds: poll,
      clockMonitorIntervalSeconds: Math.max(poll, 60),
    });
    boss.on('error', (err) => this.logger.error({ err }, 'pg-boss error'));
    await boss.start();
    await boss.createQueue(EARNING_QUEUE, {
      name: EARNING_QUEUE,
      policy: 'singleton',
      retryLimit: 2,
      retryDelay: 60,
      expireInSeconds: 30 * 60,
    });
    // pg-boss turns a due schedule into a job through its own internal queue, deduplicated per minute; a
    // retried hand-over could still send the job twice (seen once in the two-instance test: two runs one
    // second apart). A singleton slot of 60 s on the job itself makes a second send in the same minute a
    // no-op, whichever instance sends it.
    await boss.schedule(
      EARNING_QUEUE,
      commissions.earningCron,
      {},
      { tz: 'UTC', singletonKey: 'scheduled', singletonSeconds: 60 },
    );
    await boss.work(EARNING_QUEUE, { pollingIntervalSeconds: poll }, async () => {
      const result = await this.commissions.runEarning();
      if (result.failures.length > 0) {
        this.logger.warn(`${result.failures.length} contract(s) failed the earning check`);
      }
      return { linesWritten: result.linesWritten, failures: result.failures.length };
    });
    this.boss = boss;
    this.logger.log(`Commission earning check scheduled: "${commissions.earningCron}" (UTC)`);
  }

  /** Stops taking jobs, waits for the one running (if any) to finish, and closes the pool. */
  async stop(): Promise<void> {
    const boss = this.boss;
    if (!boss) return;
    this.boss = null;
    await boss.stop({ graceful: true, wait: true, timeout: 30_000 });
  }
}
