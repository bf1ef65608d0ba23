import fs from "node:fs";

/**
 * The API's own duration of each answer (pino-http's responseTime, from the request's arrival to
 * the end of the answer, ms) for the saves and the list pages answered between `from` and `to`
 * (epoch ms). Beside the load generator's figures it tells the time spent inside the API from the
 * time spent waiting for a CPU or in the sockets.
 */
export function apiResponseTimes(logFile: string, from: number, to: number): { saves: number[]; pages: number[] } {
  const saves: number[] = [];
  const pages: number[] = [];
  for (const line of fs.readFileSync(logFile, "utf8").split("\n")) {
    if (!line.includes('"request completed"')) continue;
    const entry = JSON.parse(line) as { time: number; responseTime: number; req?: { method?: string; url?: string } };
    if (entry.time < from || entry.time > to || !entry.req?.url) continue;
    const url = entry.req.url;
    if (entry.req.method === "PUT" && /\/assignments\/[^/?]+$/.test(url)) saves.push(entry.responseTime);
    else if (entry.req.method === "GET" && /\/documents(\?|$)/.test(url)) pages.push(entry.responseTime);
  }
  return { saves, pages };
}
