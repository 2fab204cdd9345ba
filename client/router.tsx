import { createBrowserRouter } from 'react-router-dom';
import { AppShell } from './components/AppShell';
import { Home } from './routes/Home';
import { NotFound, RouteError } from './routes/NotFound';
import { SignIn } from './routes/SignIn';
import { BathsPage } from './features/batches/components/BathsPage';
import { BathPage } from './features/batches/components/BathPage';
import { SeriesListPage } from './features/series/components/SeriesListPage';
import { SeriesPage } from './features/series/components/SeriesPage';
import { ReferencePage } from './features/reference/components/ReferencePage';

export const router = createBrowserRouter([
  {
    element: <AppShell />,
    errorElement: <RouteError />,
    children: [
      { index: true, element: <Home /> },
      { path: 'sign-in', element: <SignIn /> },
      { path: 'baths', element: <BathsPage /> },
      { path: 'baths/:id', element: <BathPage /> },
      { path: 'series', element: <SeriesListPage /> },
      { path: 'series/:id', element: <SeriesPage /> },
      { path: 'reference', element: <ReferencePage /> },
      { path: '*', element: <NotFound /> },
    ],
  },
]);
