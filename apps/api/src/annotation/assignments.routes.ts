import { saveAssignmentInputSchema, submitAssignmentInputSchema } from "@tagloom/contracts";
import { Router } from "express";
import { actorOf, anyMember, memberOf } from "@/orgs/org-access";
import { getAssignmentView, getQueue, saveAssignment, submitAssignment } from "./assignments.service";
import "./entity-type-store";
import { idParams, noQuery, validate, validated } from "@/security/route-meta";

/**
 * An annotator's work, below /orgs/:orgId. Every member may have assignments; the service lets
 * annotators reach only their own (others' answer 404) and managers and admins all of them.
 */
export const assignmentsRouter = Router({ mergeParams: true });

assignmentsRouter.get("/queue", anyMember, validate({ query: noQuery }), async (req, res) => {
  res.json(await getQueue(memberOf(req)));
});

assignmentsRouter.get("/corpora/:corpusId/assignments/:assignmentId", anyMember, validate({ params: idParams("corpusId", "assignmentId"), query: noQuery }), async (req, res) => {
  res.json(await getAssignmentView(memberOf(req), String(req.params.corpusId), String(req.params.assignmentId)));
});

assignmentsRouter.put("/corpora/:corpusId/assignments/:assignmentId", anyMember, validate({ params: idParams("corpusId", "assignmentId"), query: noQuery, body: saveAssignmentInputSchema }), async (req, res) => {
  const input = validated(req, "body", saveAssignmentInputSchema);
  res.json(await saveAssignment(memberOf(req), String(req.params.corpusId), String(req.params.assignmentId), input));
});

assignmentsRouter.post("/corpora/:corpusId/assignments/:assignmentId/submit", anyMember, validate({ params: idParams("corpusId", "assignmentId"), query: noQuery, body: submitAssignmentInputSchema }), async (req, res) => {
  const { version } = validated(req, "body", submitAssignmentInputSchema);
  res.json(await submitAssignment(memberOf(req), String(req.params.corpusId), String(req.params.assignmentId), version, actorOf(req)));
});
