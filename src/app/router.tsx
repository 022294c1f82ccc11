import { createBrowserRouter, RouterProvider } from 'react-router';
import { ConsoleLayout } from '../components/layout/console-layout.tsx';
import { NotBuiltYet } from './routes/not-built.tsx';
import { NotFoundPage } from './routes/not-found.tsx';
import { sections } from './sections.ts';

const router = createBrowserRouter([
  {
    path: '/',
    element: <ConsoleLayout />,
    children: [
      ...sections.map((s) => (s.path === '/' ? { index: true, element: <NotBuiltYet /> } : { path: s.path.slice(1), element: <NotBuiltYet /> })),
      { path: '*', element: <NotFoundPage /> },
    ],
  },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
