import { createBrowserRouter, RouterProvider } from 'react-router-dom';
import { AccountRoute } from './routes/account';
import { AdminAuditLogRoute } from './routes/admin-audit-log';
import { AdminUsersRoute } from './routes/admin-users';
import { FirmwareRoute } from './routes/firmware';
import { ForbiddenRoute } from './routes/forbidden';
import { HomeRoute } from './routes/home';
import { MethodologyRoute } from './routes/methodology';
import { ModelRoute } from './routes/model';
import { ModelThreadsRoute } from './routes/model-threads';
import { ModerationCatalogueRoute } from './routes/moderation-catalogue';
import { ModerationQueueRoute } from './routes/moderation-queue';
import { ModerationReviewRoute } from './routes/moderation-review';
import { MySubmissionsRoute } from './routes/my-submissions';
import { NotFoundRoute } from './routes/not-found';
import { OutboxRoute } from './routes/outbox';
import { RootLayout } from './routes/root-layout';
import { ScoreboardRoute } from './routes/scoreboard';
import { SignInRoute } from './routes/sign-in';
import { SubmissionRoute } from './routes/submission';
import { SubmitRoute } from './routes/submit';
import { ThreadRoute } from './routes/thread';

const router = createBrowserRouter([
  {
    element: <RootLayout />,
    children: [
      { index: true, element: <HomeRoute /> },
      { path: 'scoreboard', element: <ScoreboardRoute /> },
      { path: 'models/:slug', element: <ModelRoute /> },
      { path: 'models/:slug/firmware/:version', element: <FirmwareRoute /> },
      { path: 'methodology', element: <MethodologyRoute /> },
      { path: 'submit', element: <SubmitRoute /> },
      { path: 'submissions/:id', element: <SubmissionRoute /> },
      { path: 'my-submissions', element: <MySubmissionsRoute /> },
      { path: 'sign-in', element: <SignInRoute /> },
      { path: 'account', element: <AccountRoute /> },
      { path: 'admin/users', element: <AdminUsersRoute /> },
      { path: 'admin/audit-log', element: <AdminAuditLogRoute /> },
      { path: 'admin/outbox', element: <OutboxRoute /> },
      { path: 'moderation', element: <ModerationQueueRoute /> },
      { path: 'moderation/catalogue', element: <ModerationCatalogueRoute /> },
      { path: 'moderation/submissions/:id', element: <ModerationReviewRoute /> },
      { path: 'models/:slug/threads', element: <ModelThreadsRoute /> },
      { path: 'threads/:id', element: <ThreadRoute /> },
      { path: 'forbidden', element: <ForbiddenRoute /> },
      { path: '*', element: <NotFoundRoute /> },
    ],
  },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
