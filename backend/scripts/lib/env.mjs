// Settings shared by the start, stop, dev and test scripts. Everything can be overridden from the
// environment; the defaults keep every service on 127.0.0.1 and on non-standard ports.
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const REPO = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../..');
export const STATE_DIR = process.env.LOAMBOOK_STATE_DIR ?? '/var/tmp/loambook';

export const pg = {
  host: '127.0.0.1',
  port: Number(process.env.PGPORT ?? 54329),
  user: process.env.PGUSER ?? 'loambook',
  password: process.env.PGPASSWORD ?? 'loambook-local-only',
  database: process.env.PGDATABASE ?? 'loambook',
  dataDir: process.env.LOAMBOOK_PGDATA ?? path.join(STATE_DIR, `pg-${process.env.PGPORT ?? 54329}`),
};

export const mail = {
  smtpPort: Number(process.env.SMTP_PORT ?? 1025),
  webPort: Number(process.env.MAILDEV_WEB_PORT ?? 1080),
};

export const s3 = {
  port: Number(process.env.S3_PORT ?? 4569),
  bucket: process.env.S3_BUCKET ?? 'loambook-files',
};

export const app = {
  port: Number(process.env.PORT ?? 3000),
};

export function log(message) {
  console.log(`[loambook] ${message}`);
}
