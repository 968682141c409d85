export function ensureInstalled(): string;
export function startPostgres(): Promise<string>;
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
