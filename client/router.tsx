import { createBrowserRouter } from 'react-router-dom';
import { AppShell } from './components/AppShell';
import { Home } from './routes/Home';
import { NotFound, RouteError } from './routes/NotFound';
import { SignIn } from './routes/SignIn';
import { ReferencePage } from './features/reference/components/ReferencePage';

export const router = createBrowserRouter([
  {
    element: <AppShell />,
    errorElement: <RouteError />,
    children: [
      { index: true, element: <Home /> },
      { path: 'sign-in', element: <SignIn /> },
      { path: 'reference', element: <ReferencePage /> },
      { path: '*', element: <NotFound /> },
    ],
  },
]);
