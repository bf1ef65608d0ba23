export type TempPostgres = {
  port: number;
  dir: string;
  url: string;
  urlFor(database: string): string;
  stop(): void;
};
export function startTempPostgres(options?: { label?: string }): Promise<TempPostgres>;
