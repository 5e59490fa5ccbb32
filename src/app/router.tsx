import { createBrowserRouter, RouterProvider } from 'react-router-dom';
import { HomeRoute } from './routes/home';
import { NotFoundRoute } from './routes/not-found';
import { RootLayout } from './routes/root-layout';

const router = createBrowserRouter([
  {
    element: <RootLayout />,
    children: [
      { index: true, element: <HomeRoute /> },
      { path: '*', element: <NotFoundRoute /> },
    ],
  },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
