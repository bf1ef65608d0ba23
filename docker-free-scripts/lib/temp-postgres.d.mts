export type TempPostgres = {
  port: number;
  dir: string;
  url: string;
  urlFor(database: string): string;
  stop(): void;
  /** Stops the server, keeping its data dir and port ("fast" = orderly, "immediate" = crash). */
  stopServer(options?: { mode?: "smart" | "fast" | "immediate" }): Promise<void>;
  /** Starts a server stopped by stopServer() again on the same data dir and port. */
  startServer(): Promise<void>;
};
export function startTempPostgres(options?: { label?: string; durableCommits?: boolean }): Promise<TempPostgres>;
