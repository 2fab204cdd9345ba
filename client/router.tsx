import { createBrowserRouter } from 'react-router-dom';
import { AppShell } from './components/AppShell';
import { Home } from './routes/Home';
import { NotFound, RouteError } from './routes/NotFound';
import { SignIn } from './routes/SignIn';
import { PhotoZoom } from './routes/PhotoZoom';
import { ImportPage } from './routes/ImportPage';
import { FixityPage } from './routes/FixityPage';

export const router = createBrowserRouter([
  {
    element: <AppShell />,
    errorElement: <RouteError />,
    children: [
      { index: true, element: <Home /> },
      { path: 'sign-in', element: <SignIn /> },
      { path: 'photos/:photoId/zoom', element: <PhotoZoom /> },
      { path: 'import', element: <ImportPage /> },
      { path: 'admin/fixity', element: <FixityPage /> },
      { path: '*', element: <NotFound /> },
    ],
  },
]);
