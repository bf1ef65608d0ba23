import { runListQuerySchema, startRunInputSchema, taggerListQuerySchema } from "@tagloom/contracts";
import { type Request, type Response, Router } from "express";
import { actorOf, allow, memberOf } from "@/orgs/org-access";
import { compareTaggers, getComparisonDocument } from "./comparisons.service";
import { downloadTaggerEvaluation, downloadTaggerModel, getTagger, listTaggers } from "./taggers.service";
import { cancelRun, getRun, listRuns, repeatRun, startRun } from "./training-runs.service";
import { bodyOrEmpty, idParams, noBody, noQuery, validate, validated } from "@/security/route-meta";

// Roles (abilities `train`, `viewTraining`, `downloadTaggers` in @tagloom/contracts): data leads
// and admins start, cancel and repeat runs and download taggers; managers read runs, taggers and
// comparisons; annotators get 403.
const trainers = allow("data_lead");
const readers = allow("data_lead", "manager");

export const trainingRouter = Router({ mergeParams: true });

const ids = (req: Request) => ({ corpusId: String(req.params.corpusId), runId: String(req.params.runId) });

function sendFile(res: Response, file: { filename: string; text: string }): void {
  res.setHeader("Content-Type", "application/json; charset=utf-8");
  res.setHeader("Content-Disposition", `attachment; filename="${file.filename}"`);
  res.setHeader("Cache-Control", "no-store");
  res.send(Buffer.from(file.text, "utf8"));
}

const startRunBody = bodyOrEmpty(startRunInputSchema);
trainingRouter.post("/corpora/:corpusId/runs", trainers, validate({ params: idParams("corpusId"), query: noQuery, body: startRunBody }), async (req, res) => {
  const input = validated(req, "body", startRunBody);
  res.status(202).json(await startRun(memberOf(req).organizationId, ids(req).corpusId, input, actorOf(req)));
});

trainingRouter.get("/corpora/:corpusId/runs", readers, validate({ params: idParams("corpusId"), query: runListQuerySchema }), async (req, res) => {
  const query = validated(req, "query", runListQuerySchema);
  res.json(await listRuns(memberOf(req).organizationId, ids(req).corpusId, query));
});

trainingRouter.get("/corpora/:corpusId/runs/:runId", readers, validate({ params: idParams("corpusId", "runId"), query: noQuery }), async (req, res) => {
  res.json(await getRun(memberOf(req).organizationId, ids(req).corpusId, ids(req).runId));
});

trainingRouter.post("/corpora/:corpusId/runs/:runId/cancel", trainers, validate({ params: idParams("corpusId", "runId"), query: noQuery, body: noBody }), async (req, res) => {
  res.json(await cancelRun(memberOf(req).organizationId, ids(req).corpusId, ids(req).runId, actorOf(req)));
});

trainingRouter.post("/corpora/:corpusId/runs/:runId/repeat", trainers, validate({ params: idParams("corpusId", "runId"), query: noQuery, body: noBody }), async (req, res) => {
  res.status(202).json(await repeatRun(memberOf(req).organizationId, ids(req).corpusId, ids(req).runId, actorOf(req)));
});

trainingRouter.get("/corpora/:corpusId/taggers", readers, validate({ params: idParams("corpusId"), query: taggerListQuerySchema }), async (req, res) => {
  const query = validated(req, "query", taggerListQuerySchema);
  res.json(await listTaggers(memberOf(req).organizationId, ids(req).corpusId, query));
});

trainingRouter.get("/corpora/:corpusId/taggers/:taggerId", readers, validate({ params: idParams("corpusId", "taggerId"), query: noQuery }), async (req, res) => {
  res.json(await getTagger(memberOf(req).organizationId, ids(req).corpusId, String(req.params.taggerId)));
});

trainingRouter.get("/corpora/:corpusId/taggers/:taggerId/download", trainers, validate({ params: idParams("corpusId", "taggerId"), query: noQuery }), async (req, res) => {
  sendFile(res, await downloadTaggerModel(memberOf(req).organizationId, ids(req).corpusId, String(req.params.taggerId), actorOf(req)));
});

trainingRouter.get("/corpora/:corpusId/taggers/:taggerId/evaluation", trainers, validate({ params: idParams("corpusId", "taggerId"), query: noQuery }), async (req, res) => {
  sendFile(res, await downloadTaggerEvaluation(memberOf(req).organizationId, ids(req).corpusId, String(req.params.taggerId), actorOf(req)));
});

trainingRouter.get("/corpora/:corpusId/taggers/:taggerId/compare/:otherId", readers, validate({ params: idParams("corpusId", "taggerId", "otherId"), query: noQuery }), async (req, res) => {
  res.json(await compareTaggers(memberOf(req).organizationId, ids(req).corpusId, String(req.params.taggerId), String(req.params.otherId)));
});

trainingRouter.get("/corpora/:corpusId/taggers/:taggerId/compare/:otherId/documents/:documentId", readers, validate({ params: idParams("corpusId", "taggerId", "otherId", "documentId"), query: noQuery }), async (req, res) => {
  res.json(
    await getComparisonDocument(
      memberOf(req).organizationId,
      ids(req).corpusId,
      String(req.params.taggerId),
      String(req.params.otherId),
      String(req.params.documentId),
    ),
  );
});
