export const REPO: string;
export const STATE_DIR: string;
export const pg: {
  host: string;
  port: number;
  user: string;
  password: string;
  database: string;
  dataDir: string;
};
export const mail: { smtpPort: number; webPort: number };
export const s3: { port: number; bucket: string };
export const app: { port: number };
export const stripe: {
  fakePort: number;
  secretKey: string;
  webhookSecret: string;
  webhookUrl: string;
  payoutIntervalMs: number;
};
export function log(message: string): void;
