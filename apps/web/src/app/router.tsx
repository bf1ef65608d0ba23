import { createBrowserRouter, type RouteObject } from "react-router";
import { paths } from "@/config/paths";
import { AreaPlaceholder } from "./routes/area-placeholder";
import { AssignmentRoute } from "./routes/assignment";
import { BatchDetailRoute } from "./routes/batch-detail";
import { BatchNewRoute } from "./routes/batch-new";
import { BatchesRoute } from "./routes/batches";
import { AuditRoute } from "./routes/audit";
import { CorporaRoute } from "./routes/corpora";
import { CorpusDocumentsRoute } from "./routes/corpus-documents";
import { CorpusLayoutRoute } from "./routes/corpus-layout";
import { CorpusSchemaRoute } from "./routes/corpus-schema";
import { CorpusSettingsRoute } from "./routes/corpus-settings";
import { CorpusUploadsRoute } from "./routes/corpus-uploads";
import { DocumentRoute } from "./routes/document";
import { ForgotPasswordRoute } from "./routes/forgot-password";
import { InvitationRoute } from "./routes/invitation";
import { MembersRoute } from "./routes/members";
import { NewOrganizationRoute } from "./routes/new-organization";
import { NotFoundRoute } from "./routes/not-found";
import { OrgHomeRoute } from "./routes/org-home";
import { OrgLayoutRoute, RootRedirectRoute } from "./routes/org-layout";
import { OrgSettingsRoute } from "./routes/org-settings";
import { OutboxRoute } from "./routes/outbox";
import { QueueRoute } from "./routes/queue";
import { ResetPasswordRoute } from "./routes/reset-password";
import { ReviewRoute } from "./routes/review";
import { ReviewDocumentRoute } from "./routes/review-document";
import { SignInRoute } from "./routes/sign-in";
import { SignUpRoute } from "./routes/sign-up";
import { VerifyEmailRoute } from "./routes/verify-email";

/** Screens inside an organization, relative to /o/:orgId. Features add their routes here. */
const orgRoutes: RouteObject[] = [
  { index: true, element: <OrgHomeRoute /> },
  { path: "members", element: <MembersRoute /> },
  { path: "audit", element: <AuditRoute /> },
  { path: "settings", element: <OrgSettingsRoute /> },
  { path: "corpora", element: <CorporaRoute /> },
  {
    path: "corpora/:corpusId",
    element: <CorpusLayoutRoute />,
    children: [
      { index: true, element: <CorpusDocumentsRoute /> },
      { path: "schema", element: <CorpusSchemaRoute /> },
      { path: "uploads", element: <CorpusUploadsRoute /> },
      { path: "settings", element: <CorpusSettingsRoute /> },
    ],
  },
  { path: "corpora/:corpusId/documents/:documentId", element: <DocumentRoute /> },
  { path: "queue", element: <QueueRoute /> },
  { path: "batches", element: <BatchesRoute /> },
  { path: "batches/new", element: <BatchNewRoute /> },
  { path: "review", element: <ReviewRoute /> },
  { path: "corpora/:corpusId/assignments/:assignmentId", element: <AssignmentRoute /> },
  { path: "corpora/:corpusId/batches/:batchId", element: <BatchDetailRoute /> },
  { path: "corpora/:corpusId/batches/:batchId/review/:documentId", element: <ReviewDocumentRoute /> },
  { path: "taggers/*", element: <AreaPlaceholder title="Taggers" what="Training runs and taggers arrive with the training work." /> },
  { path: "billing", element: <AreaPlaceholder title="Billing" what="Seats and billing arrive with the billing work." /> },
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

export const router = createBrowserRouter(routes);
