import { createEntityTypeInputSchema, deleteEntityTypeInputSchema, updateEntityTypeInputSchema } from "@tagloom/contracts";
import { Router } from "express";
import { actorOf, allow, anyMember, memberOf } from "@/orgs/org-access";
import { listEntityTypes } from "./corpora.service";
import { changeEntityType, createEntityType, deleteEntityType, getEntityTypeUsage } from "./entity-types.service";
import { bodyOrEmpty, idParams, noQuery, validate, validated } from "@/security/route-meta";

export const entityTypesRouter = Router({ mergeParams: true });

entityTypesRouter.get("/corpora/:corpusId/entity-types", anyMember, validate({ params: idParams("corpusId"), query: noQuery }), async (req, res) => {
  res.json({ items: await listEntityTypes(memberOf(req).organizationId, String(req.params.corpusId)) });
});

entityTypesRouter.post("/corpora/:corpusId/entity-types", allow("manager"), validate({ params: idParams("corpusId"), query: noQuery, body: createEntityTypeInputSchema }), async (req, res) => {
  const input = validated(req, "body", createEntityTypeInputSchema);
  res.status(201).json(await createEntityType(memberOf(req).organizationId, String(req.params.corpusId), input, actorOf(req)));
});

entityTypesRouter.patch("/corpora/:corpusId/entity-types/:typeId", allow("manager"), validate({ params: idParams("corpusId", "typeId"), query: noQuery, body: updateEntityTypeInputSchema }), async (req, res) => {
  const input = validated(req, "body", updateEntityTypeInputSchema);
  const { organizationId } = memberOf(req);
  res.json(await changeEntityType(organizationId, String(req.params.corpusId), String(req.params.typeId), input, actorOf(req)));
});

entityTypesRouter.get("/corpora/:corpusId/entity-types/:typeId/usage", allow("manager"), validate({ params: idParams("corpusId", "typeId"), query: noQuery }), async (req, res) => {
  res.json(await getEntityTypeUsage(memberOf(req).organizationId, String(req.params.corpusId), String(req.params.typeId)));
});

const deleteEntityTypeBody = bodyOrEmpty(deleteEntityTypeInputSchema);
entityTypesRouter.delete("/corpora/:corpusId/entity-types/:typeId", allow("manager"), validate({ params: idParams("corpusId", "typeId"), query: noQuery, body: deleteEntityTypeBody }), async (req, res) => {
  const { confirm } = validated(req, "body", deleteEntityTypeBody);
  const { organizationId } = memberOf(req);
  await deleteEntityType(organizationId, String(req.params.corpusId), String(req.params.typeId), confirm === true, actorOf(req));
  res.status(204).end();
});
