import type { ComponentType } from "react";
import { createBrowserRouter, type RouteObject } from "react-router";
import { Skeleton } from "@/components/ui/card";
import { paths } from "@/config/paths";
import { ForgotPasswordRoute } from "./routes/forgot-password";
import { InvitationRoute } from "./routes/invitation";
import { MembersRoute } from "./routes/members";
import { NewOrganizationRoute } from "./routes/new-organization";
import { NotFoundRoute } from "./routes/not-found";
import { OrgHomeRoute } from "./routes/org-home";
import { OrgLayoutRoute, RootRedirectRoute } from "./routes/org-layout";
import { OrgSettingsRoute } from "./routes/org-settings";
import { OutboxRoute } from "./routes/outbox";
import { ResetPasswordRoute } from "./routes/reset-password";
import { SignInRoute } from "./routes/sign-in";
import { SignUpRoute } from "./routes/sign-up";
import { VerifyEmailRoute } from "./routes/verify-email";

/**
 * A screen loaded on first visit: the sign-in screens and the frame load at once, the working
 * screens (and their heavier dependencies, like the annotation workspace) only when opened.
 */
function screen<M extends Record<string, unknown>>(load: () => Promise<M>, name: keyof M & string): RouteObject["lazy"] {
  return async () => ({ Component: (await load())[name] as ComponentType });
}

/** Screens inside an organization, relative to /o/:orgId. Features add their routes here. */
const orgRoutes: RouteObject[] = [
  { index: true, element: <OrgHomeRoute /> },
  { path: "members", element: <MembersRoute /> },
  { path: "audit", lazy: screen(() => import("./routes/audit"), "AuditRoute") },
  { path: "settings", element: <OrgSettingsRoute /> },
  { path: "tokens", lazy: screen(() => import("./routes/api-tokens"), "ApiTokensRoute") },
  { path: "corpora", lazy: screen(() => import("./routes/corpora"), "CorporaRoute") },
  {
    path: "corpora/:corpusId",
    lazy: screen(() => import("./routes/corpus-layout"), "CorpusLayoutRoute"),
    children: [
      { index: true, lazy: screen(() => import("./routes/corpus-documents"), "CorpusDocumentsRoute") },
      { path: "schema", lazy: screen(() => import("./routes/corpus-schema"), "CorpusSchemaRoute") },
      { path: "uploads", lazy: screen(() => import("./routes/corpus-uploads"), "CorpusUploadsRoute") },
      { path: "suggester", lazy: screen(() => import("./routes/corpus-suggester"), "CorpusSuggesterRoute") },
      { path: "uncertain", lazy: screen(() => import("./routes/corpus-uncertain"), "CorpusUncertainRoute") },
      { path: "settings", lazy: screen(() => import("./routes/corpus-settings"), "CorpusSettingsRoute") },
      { path: "training", lazy: screen(() => import("./routes/corpus-training"), "CorpusTrainingRoute") },
      { path: "training/new", lazy: screen(() => import("./routes/run-new"), "RunNewRoute") },
      { path: "training/runs/:runId", lazy: screen(() => import("./routes/run"), "RunRoute") },
      { path: "training/taggers/:taggerId", lazy: screen(() => import("./routes/tagger"), "TaggerRoute") },
      { path: "training/taggers/:taggerId/compare/:otherId", lazy: screen(() => import("./routes/compare"), "CompareRoute") },
      { path: "training/taggers/:taggerId/compare/:otherId/documents/:documentId", lazy: screen(() => import("./routes/compare-document"), "CompareDocumentRoute") },
    ],
  },
  { path: "corpora/:corpusId/documents/:documentId", lazy: screen(() => import("./routes/document"), "DocumentRoute") },
  { path: "queue", lazy: screen(() => import("./routes/queue"), "QueueRoute") },
  { path: "batches", lazy: screen(() => import("./routes/batches"), "BatchesRoute") },
  { path: "batches/new", lazy: screen(() => import("./routes/batch-new"), "BatchNewRoute") },
  { path: "review", lazy: screen(() => import("./routes/review"), "ReviewRoute") },
  { path: "corpora/:corpusId/assignments/:assignmentId", lazy: screen(() => import("./routes/assignment"), "AssignmentRoute") },
  { path: "corpora/:corpusId/batches/:batchId", lazy: screen(() => import("./routes/batch-detail"), "BatchDetailRoute") },
  { path: "corpora/:corpusId/batches/:batchId/review/:documentId", lazy: screen(() => import("./routes/review-document"), "ReviewDocumentRoute") },
  { path: "taggers", lazy: screen(() => import("./routes/taggers"), "TaggersRoute") },
  { path: "billing", lazy: screen(() => import("./routes/billing"), "BillingRoute") },
];

export const routes: RouteObject[] = [
  { path: paths.home.path, element: <RootRedirectRoute /> },
  { path: paths.signIn.path, element: <SignInRoute /> },
  { path: paths.signUp.path, element: <SignUpRoute /> },
  { path: paths.forgotPassword.path, element: <ForgotPasswordRoute /> },
  { path: paths.resetPassword.path, element: <ResetPasswordRoute /> },
  { path: paths.verifyEmail.path, element: <VerifyEmailRoute /> },
  { path: paths.invitation.path, element: <InvitationRoute /> },
  { path: paths.newOrganization.path, element: <NewOrganizationRoute /> },
  { path: paths.outbox.path, element: <OutboxRoute /> },
  { path: paths.org.root.path, element: <OrgLayoutRoute />, children: orgRoutes },
  { path: "*", element: <NotFoundRoute /> },
];

/** Shown while the first screen's code loads on a fresh page load (React Router's hydrate fallback). */
function FirstLoad() {
  return (
    <div className="p-8">
      <Skeleton />
    </div>
  );
}

export const router = createBrowserRouter([{ HydrateFallback: FirstLoad, children: routes }]);
