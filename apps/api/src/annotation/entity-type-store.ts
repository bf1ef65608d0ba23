import { registerEntityTypeSpanStore } from "@/corpora/entity-types.service";
import { countTypeInAssignments, removeTypeFromAssignments } from "./assignments.repository";

// Deleting an entity type counts and removes its spans in annotators' assignments too (in the
// transaction that deletes the type), so no assignment keeps a span of a type that is gone.
registerEntityTypeSpanStore({
  name: "assignments",
  count: (organizationId, typeId, db) => countTypeInAssignments(organizationId, typeId, db),
  remove: async (organizationId, typeId, db) => {
    await removeTypeFromAssignments(organizationId, typeId, db);
  },
});
