import { createBrowserRouter } from 'react-router-dom';
import { SignInPage } from '@/features/auth/components/sign-in-page';
import { HomePage } from '@/features/home/components/home-page';
import { AppLayout } from './layout';

export const router = createBrowserRouter([
  { path: '/sign-in', element: <SignInPage /> },
  {
    element: <AppLayout />,
    children: [{ index: true, element: <HomePage /> }],
  },
]);
