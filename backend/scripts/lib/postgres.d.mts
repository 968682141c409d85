export function ensureInstalled(): string;
/** `started` is false when the cluster was already running. */
export function startPostgres(): Promise<{ bin: string; started: boolean }>;
export function stopPostgres(): Promise<void>;
export function ensureDatabase(name: string): Promise<void>;
export function dropDatabase(name: string): Promise<void>;
export function connection(database: string): {
  host: string;
  port: number;
  user: string;
  password: string;
  database: string;
};
