import { exportQuerySchema } from "@tagloom/contracts";
import { Router } from "express";
import { actorOf, allow, memberOf } from "@/orgs/org-access";
import { planExport, writeExport } from "./exports.service";
import { idParams, validate, validated } from "@/security/route-meta";

export const exportsRouter = Router({ mergeParams: true });

// Streamed: the headers go out first, then documents as the database cursor yields them. An
// error after the first byte can only cut the download short, so the connection is destroyed
// (the client sees a failed download rather than a truncated file that looks complete).
exportsRouter.get("/corpora/:corpusId/exports", allow("manager", "data_lead"), validate({ params: idParams("corpusId"), query: exportQuerySchema }), async (req, res) => {
  const query = validated(req, "query", exportQuerySchema);
  const { organizationId } = memberOf(req);
  const corpusId = String(req.params.corpusId);
  const plan = await planExport(organizationId, corpusId, query);
  res.status(200);
  res.setHeader("Content-Type", plan.contentType);
  res.setHeader("Content-Disposition", `attachment; filename="${plan.filename}"`);
  res.setHeader("Cache-Control", "no-store");
  try {
    await writeExport(organizationId, corpusId, query, res, actorOf(req));
    res.end();
  } catch (err) {
    if (!res.headersSent) throw err;
    req.log?.error({ err }, "export failed mid-stream");
    res.destroy(err as Error);
  }
});
