import { createBrowserRouter } from 'react-router-dom';
import { AppShell } from './components/AppShell';
import { RequireAbility } from './features/auth/components/RequireAbility';
import { ForgotPassword } from './routes/ForgotPassword';
import { Home } from './routes/Home';
import { JoinTeam } from './routes/JoinTeam';
import { NotFound, RouteError } from './routes/NotFound';
import { Outbox } from './routes/Outbox';
import { ResetPassword } from './routes/ResetPassword';
import { SignIn } from './routes/SignIn';
import { BathsPage } from './features/batches/components/BathsPage';
import { BathPage } from './features/batches/components/BathPage';
import { SeriesListPage } from './features/series/components/SeriesListPage';
import { SeriesPage } from './features/series/components/SeriesPage';
import { ReferencePage } from './features/reference/components/ReferencePage';
import { Archive } from './routes/Archive';
import { PieceDetailPage } from './routes/PieceDetail';
import { PieceEditPage, PieceNewPage } from './routes/PieceEdit';
import { Team } from './routes/Team';

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
      { path: 'archive', element: <Archive /> },
      { path: 'archive/new', element: <PieceNewPage /> },
      { path: 'archive/:id', element: <PieceDetailPage /> },
      { path: 'archive/:id/edit', element: <PieceEditPage /> },
      { path: 'forgot-password', element: <ForgotPassword /> },
      { path: 'reset-password/:token', element: <ResetPassword /> },
      { path: 'join/:token', element: <JoinTeam /> },
      { element: <RequireAbility action="team:manage" />, children: [{ path: 'team', element: <Team /> }] },
      { element: <RequireAbility action="outbox:read" />, children: [{ path: 'outbox', element: <Outbox /> }] },
      { path: '*', element: <NotFound /> },
    ],
  },
]);
