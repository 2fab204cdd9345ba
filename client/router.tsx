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
import { Team } from './routes/Team';
import { PhotoZoom } from './routes/PhotoZoom';
import { ImportPage } from './routes/ImportPage';
import { FixityPage } from './routes/FixityPage';
import { ImagingTolerancesPage } from './routes/ImagingTolerancesPage';
import { Archive } from './routes/Archive';
import { PieceDetailPage } from './routes/PieceDetail';
import { PieceEditPage, PieceNewPage } from './routes/PieceEdit';
import { TrialsPage } from './features/trials/components/TrialsPage';
import { TrialNewPage } from './features/trials/components/TrialNewPage';
import { TrialPage } from './features/trials/components/TrialPage';
import { SideBySidePage } from './features/trials/components/SideBySidePage';
import { Search } from './routes/Search';
import { SuggestionsPage } from './features/suggestions';

export const router = createBrowserRouter([
  {
    element: <AppShell />,
    errorElement: <RouteError />,
    children: [
      { index: true, element: <Home /> },
      { path: 'sign-in', element: <SignIn /> },
      {
        element: <RequireAbility action="batch:read" />,
        children: [
          { path: 'baths', element: <BathsPage /> },
          { path: 'baths/:id', element: <BathPage /> },
        ],
      },
      {
        element: <RequireAbility action="series:read" />,
        children: [
          { path: 'series', element: <SeriesListPage /> },
          { path: 'series/:id', element: <SeriesPage /> },
        ],
      },
      { path: 'reference', element: <ReferencePage /> },
      { path: 'archive', element: <Archive /> },
      {
        element: <RequireAbility action="piece:create" />,
        children: [{ path: 'archive/new', element: <PieceNewPage /> }],
      },
      { path: 'archive/:id', element: <PieceDetailPage /> },
      {
        element: <RequireAbility action="piece:update" />,
        children: [{ path: 'archive/:id/edit', element: <PieceEditPage /> }],
      },
      { path: 'forgot-password', element: <ForgotPassword /> },
      { path: 'reset-password/:token', element: <ResetPassword /> },
      { path: 'join/:token', element: <JoinTeam /> },
      { element: <RequireAbility action="team:manage" />, children: [{ path: 'team', element: <Team /> }] },
      { element: <RequireAbility action="outbox:read" />, children: [{ path: 'outbox', element: <Outbox /> }] },
      { path: 'photos/:photoId/zoom', element: <PhotoZoom /> },
      { element: <RequireAbility action="import:run" />, children: [{ path: 'import', element: <ImportPage /> }] },
      {
        element: <RequireAbility action="fixity:run" />,
        children: [{ path: 'admin/fixity', element: <FixityPage /> }],
      },
      {
        element: <RequireAbility action="reference:manage" />,
        children: [{ path: 'admin/imaging-tolerances', element: <ImagingTolerancesPage /> }],
      },
      {
        element: <RequireAbility action="trial:read" />,
        children: [
          { path: 'trials', element: <TrialsPage /> },
          { path: 'trials/:id', element: <TrialPage /> },
          { path: 'archive/:id/side-by-side', element: <SideBySidePage /> },
          { path: 'suggest', element: <SuggestionsPage /> },
        ],
      },
      {
        element: <RequireAbility action="trial:create" />,
        children: [{ path: 'trials/new', element: <TrialNewPage /> }],
      },
      { path: 'search', element: <Search /> },
      { path: '*', element: <NotFound /> },
    ],
  },
]);
