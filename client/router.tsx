import { createBrowserRouter } from 'react-router-dom';
import { AppShell } from './components/AppShell';
import { Home } from './routes/Home';
import { NotFound, RouteError } from './routes/NotFound';
import { SignIn } from './routes/SignIn';
import { ReferencePage } from './features/reference/components/ReferencePage';
import { Archive } from './routes/Archive';
import { PieceDetailPage } from './routes/PieceDetail';
import { PieceEditPage, PieceNewPage } from './routes/PieceEdit';

export const router = createBrowserRouter([
  {
    element: <AppShell />,
    errorElement: <RouteError />,
    children: [
      { index: true, element: <Home /> },
      { path: 'sign-in', element: <SignIn /> },
      { path: 'reference', element: <ReferencePage /> },
      { path: 'archive', element: <Archive /> },
      { path: 'archive/new', element: <PieceNewPage /> },
      { path: 'archive/:id', element: <PieceDetailPage /> },
      { path: 'archive/:id/edit', element: <PieceEditPage /> },
      { path: '*', element: <NotFound /> },
    ],
  },
]);
