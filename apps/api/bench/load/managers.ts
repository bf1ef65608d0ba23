import autocannon from "autocannon";
import type { Manager } from "./people";
import type { Recorder } from "./stats";

/** The Documents table views a manager pages through (sort, direction and filters as the web sends them). */
const VIEWS = [
  "sort=created&dir=desc",
  "sort=title&dir=asc",
  "status=in_progress",
  "sort=tokens&dir=desc",
  "split=train&sort=title&dir=asc",
  "q=harbour",
  "status=gold&split=test",
  "q=kalori%20ledger&sort=title&dir=asc",
];
const PAGES_PER_VIEW = 20;

export type ManagerLog = { pages: number; rows: number; walks: number; rowsSeenTwice: number; refusals: Array<{ status: number; body: string }> };

/**
 * Each manager pages the Documents table on their own connection and session: a view's first
 * page, then its next pages by the cursor each answer gives (up to PAGES_PER_VIEW pages), then the
 * next view. A row met twice within one walk through a view would mean the cursors skip or repeat.
 */
export async function runManagers(base: string, org: { orgId: string; corpusId: string }, managers: Manager[], opts: { seconds: number; rate: number; recorder: Recorder }): Promise<ManagerLog> {
  const total: ManagerLog = { pages: 0, rows: 0, walks: 0, rowsSeenTwice: 0, refusals: [] };
  const listPath = `/api/orgs/${org.orgId}/corpora/${org.corpusId}/documents`;
  await Promise.all(
    managers.map(async (m, i) => {
      await new Promise((r) => setTimeout(r, (i * 1000) / managers.length));
      const st = { view: i % VIEWS.length, cursor: null as string | null, pages: 0, seen: new Set<string>() };
      const nextView = () => {
        st.view = (st.view + 1) % VIEWS.length;
        st.cursor = null;
        st.pages = 0;
        st.seen.clear();
        total.walks += 1;
      };
      const instance = autocannon({
        url: `${base}${listPath}`,
        connections: 1,
        ...(opts.rate > 0 ? { connectionRate: opts.rate } : {}),
        duration: opts.seconds,
        timeout: 10,
        requests: [
          {
            method: "GET",
            setupRequest: (req) => ({
              ...req,
              path: `${listPath}?limit=50&${VIEWS[st.view]}${st.cursor ? `&cursor=${encodeURIComponent(st.cursor)}` : ""}`,
              headers: { Accept: "application/json", Cookie: m.cookie },
            }),
            onResponse: (status, body) => {
              if (status !== 200) {
                if (total.refusals.length < 5) total.refusals.push({ status, body: body.slice(0, 200) });
                return nextView();
              }
              const page = JSON.parse(body) as { items: Array<{ id: string }>; nextCursor: string | null };
              total.pages += 1;
              total.rows += page.items.length;
              for (const row of page.items) {
                if (st.seen.has(row.id)) total.rowsSeenTwice += 1;
                st.seen.add(row.id);
              }
              st.pages += 1;
              if (page.nextCursor && st.pages < PAGES_PER_VIEW) st.cursor = page.nextCursor;
              else nextView();
            },
          },
        ],
      });
      await opts.recorder.watch(instance);
    }),
  );
  return total;
}
