import type { ComponentType } from 'react';
import { createBrowserRouter, RouterProvider } from 'react-router-dom';
import { HomeRoute } from './routes/home';
import { NotFoundRoute } from './routes/not-found';
import { RootLayout } from './routes/root-layout';

// Every page but the home page is its own chunk, loaded when first visited: the
// charts and the in-browser analysis engine stay out of the first download.
function page<M>(load: () => Promise<M>, name: keyof M) {
  return async () => ({ Component: (await load())[name] as ComponentType });
}

const router = createBrowserRouter([
  {
    element: <RootLayout />,
    children: [
      { index: true, element: <HomeRoute /> },
      { path: 'scoreboard', lazy: page(() => import('./routes/scoreboard'), 'ScoreboardRoute') },
      { path: 'models/:slug', lazy: page(() => import('./routes/model'), 'ModelRoute') },
      { path: 'models/:slug/firmware/:version', lazy: page(() => import('./routes/firmware'), 'FirmwareRoute') },
      { path: 'models/:slug/threads', lazy: page(() => import('./routes/model-threads'), 'ModelThreadsRoute') },
      { path: 'threads/:id', lazy: page(() => import('./routes/thread'), 'ThreadRoute') },
      { path: 'methodology', lazy: page(() => import('./routes/methodology'), 'MethodologyRoute') },
      { path: 'submit', lazy: page(() => import('./routes/submit'), 'SubmitRoute') },
      { path: 'submissions/:id', lazy: page(() => import('./routes/submission'), 'SubmissionRoute') },
      { path: 'my-submissions', lazy: page(() => import('./routes/my-submissions'), 'MySubmissionsRoute') },
      { path: 'sign-in', lazy: page(() => import('./routes/sign-in'), 'SignInRoute') },
      { path: 'account', lazy: page(() => import('./routes/account'), 'AccountRoute') },
      { path: 'admin/users', lazy: page(() => import('./routes/admin-users'), 'AdminUsersRoute') },
      { path: 'admin/audit-log', lazy: page(() => import('./routes/admin-audit-log'), 'AdminAuditLogRoute') },
      { path: 'admin/outbox', lazy: page(() => import('./routes/outbox'), 'OutboxRoute') },
      { path: 'moderation', lazy: page(() => import('./routes/moderation-queue'), 'ModerationQueueRoute') },
      { path: 'moderation/catalogue', lazy: page(() => import('./routes/moderation-catalogue'), 'ModerationCatalogueRoute') },
      { path: 'moderation/submissions/:id', lazy: page(() => import('./routes/moderation-review'), 'ModerationReviewRoute') },
      { path: 'forbidden', lazy: page(() => import('./routes/forbidden'), 'ForbiddenRoute') },
      { path: '*', element: <NotFoundRoute /> },
    ],
  },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
