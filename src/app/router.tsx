import type { ComponentType } from 'react';
import { createBrowserRouter, RouterProvider } from 'react-router-dom';
import { HomeRoute } from './routes/home';
import { NotFoundRoute } from './routes/not-found';
import { RootLayout } from './routes/root-layout';
import { RouteErrorRoute } from './routes/route-error';

// Every page but the home page is its own chunk, loaded when first visited: the
// charts and the in-browser analysis engine stay out of the first download.
function page<M>(load: () => Promise<M>, name: keyof M) {
  return async () => ({ Component: (await load())[name] as ComponentType });
}

const router = createBrowserRouter([
  {
    element: <RootLayout />,
    // A page that fails (a chunk gone after a deploy, an error while rendering)
    // shows our own page inside the site's frame.
    errorElement: <RouteErrorRoute />,
    children: [
      {
        errorElement: <RouteErrorRoute />,
        children: [
          { index: true, handle: { title: 'Power meter accuracy from real rides' }, element: <HomeRoute /> },
          { path: 'scoreboard', handle: { title: 'Scoreboard' }, lazy: page(() => import('./routes/scoreboard'), 'ScoreboardRoute') },
          { path: 'models/:slug', handle: { title: 'Power meter' }, lazy: page(() => import('./routes/model'), 'ModelRoute') },
          {
            path: 'models/:slug/firmware/:version',
            handle: { title: 'Firmware' },
            lazy: page(() => import('./routes/firmware'), 'FirmwareRoute'),
          },
          {
            path: 'models/:slug/threads',
            handle: { title: 'Discussion' },
            lazy: page(() => import('./routes/model-threads'), 'ModelThreadsRoute'),
          },
          { path: 'threads/:id', handle: { title: 'Thread' }, lazy: page(() => import('./routes/thread'), 'ThreadRoute') },
          { path: 'methodology', handle: { title: 'Methodology' }, lazy: page(() => import('./routes/methodology'), 'MethodologyRoute') },
          { path: 'submit', handle: { title: 'Submit a ride' }, lazy: page(() => import('./routes/submit'), 'SubmitRoute') },
          { path: 'submissions/:id', handle: { title: 'Submission' }, lazy: page(() => import('./routes/submission'), 'SubmissionRoute') },
          {
            path: 'my-submissions',
            handle: { title: 'Your submissions' },
            lazy: page(() => import('./routes/my-submissions'), 'MySubmissionsRoute'),
          },
          { path: 'sign-in', handle: { title: 'Sign in' }, lazy: page(() => import('./routes/sign-in'), 'SignInRoute') },
          { path: 'my-equipment', handle: { title: 'My meters' }, lazy: page(() => import('./routes/my-equipment'), 'MyEquipmentRoute') },
          { path: 'account', handle: { title: 'Your account' }, lazy: page(() => import('./routes/account'), 'AccountRoute') },
          {
            path: 'admin/users',
            handle: { title: 'People and roles' },
            lazy: page(() => import('./routes/admin-users'), 'AdminUsersRoute'),
          },
          {
            path: 'admin/audit-log',
            handle: { title: 'Audit log' },
            lazy: page(() => import('./routes/admin-audit-log'), 'AdminAuditLogRoute'),
          },
          {
            path: 'admin/reanalysis',
            handle: { title: 'Re-analysis' },
            lazy: page(() => import('./routes/admin-reanalysis'), 'AdminReanalysisRoute'),
          },
          { path: 'admin/outbox', handle: { title: 'Outbox' }, lazy: page(() => import('./routes/outbox'), 'OutboxRoute') },
          {
            path: 'moderation',
            handle: { title: 'Review queue' },
            lazy: page(() => import('./routes/moderation-queue'), 'ModerationQueueRoute'),
          },
          {
            path: 'moderation/catalogue',
            handle: { title: 'Catalogue curation' },
            lazy: page(() => import('./routes/moderation-catalogue'), 'ModerationCatalogueRoute'),
          },
          {
            path: 'moderation/submissions/:id',
            handle: { title: 'Review' },
            lazy: page(() => import('./routes/moderation-review'), 'ModerationReviewRoute'),
          },
          { path: 'forbidden', handle: { title: 'Not allowed' }, lazy: page(() => import('./routes/forbidden'), 'ForbiddenRoute') },
          { path: '*', handle: { title: 'Page not found' }, element: <NotFoundRoute /> },
        ],
      },
    ],
  },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
