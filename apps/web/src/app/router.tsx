import { lazy, Suspense } from 'react';
import { createBrowserRouter, Outlet } from 'react-router-dom';
import { DemoBanner } from '@/features/auth/components/demo-banner';
import { SignInPage } from '@/features/auth/components/sign-in-page';
import { HomePage } from '@/features/home/components/home-page';
import { AppLayout } from './layout';

// Every screen but sign-in and home loads on demand: the bench brings konva, the references bring mathjs.
const JobsPage = lazy(() => import('@/features/jobs/components/jobs-page'));
const NewJobPage = lazy(() => import('@/features/jobs/components/new-job-page'));
const BenchPage = lazy(() => import('@/features/bench/components/bench-page'));
const ReviewQueuePage = lazy(() => import('@/features/review/components/review-queue-page'));
const ReviewJobPage = lazy(() => import('@/features/review/components/review-job-page'));
const RepairPage = lazy(() => import('@/features/repair/components/repair-page'));
const ReportPage = lazy(() => import('@/features/report/components/report-page'));
const BoardLibraryPage = lazy(() => import('@/features/board-library/components/board-library-page'));
const BoardEditorPage = lazy(() => import('@/features/board-library/components/board-editor-page'));
const BoardCapturePage = lazy(() => import('@/features/board-capture/components/capture-page'));
const ReferencesPage = lazy(() => import('@/features/references/components/references-page'));
const CustomerPage = lazy(() => import('@/features/customer-page/components/customer-page'));
const MailOutboxPage = lazy(() => import('@/features/mail-outbox/components/mail-outbox-page'));
const JobBillingPage = lazy(() => import('@/features/billing/components/job-billing-page'));
const FirstRunPage = lazy(() => import('@/features/shop/components/first-run-page'));
const ShopPage = lazy(() => import('@/features/shop/components/shop-page'));
const PeoplePage = lazy(() => import('@/features/people/components/people-page'));
const CustomersPage = lazy(() => import('@/features/customers/components/customers-page'));
const CustomerDetailPage = lazy(() => import('@/features/customers/components/customer-detail-page'));
const AccountPage = lazy(() => import('@/features/account/components/account-page'));
const PasswordLinkPage = lazy(() => import('@/features/auth/components/password-link-page'));
const ForgotPasswordPage = lazy(() => import('@/features/auth/components/forgot-password-page'));
const SerialLookupPage = lazy(() => import('@/features/board-history/components/board-history-page'));
const JobHistoryPage = lazy(async () => ({ default: (await import('@/features/board-history/components/board-history-page')).JobHistoryPage }));
const ServiceTermsPage = lazy(() => import('@/features/service-terms/components/service-terms-page'));
const PartsBinPage = lazy(() => import('@/features/parts-bin/components/parts-bin-page'));
const MeterImportPage = lazy(() => import('@/features/meter-import/components/meter-import-page'));
const StatsPage = lazy(() => import('@/features/shop-stats/components/stats-page'));
const BillingSettingsPage = lazy(() => import('@/features/billing/components/billing-settings-page'));

const loading = <p className="p-6">Loading…</p>;
const page = (el: React.ReactNode) => <Suspense fallback={loading}>{el}</Suspense>;

/** Every page, signed in or not: the demo's banner above it. */
function Root() {
  return (
    <div className="flex min-h-full flex-col">
      <DemoBanner />
      <div className="flex flex-1 flex-col">
        <Outlet />
      </div>
    </div>
  );
}

export const router = createBrowserRouter([
  {
    element: <Root />,
    children: [
      { path: '/sign-in', element: <SignInPage /> },
      { path: '/first-run', element: page(<FirstRunPage />) },
      { path: '/invitation/:token', element: page(<PasswordLinkPage link="invitation" />) },
      { path: '/forgot-password', element: page(<ForgotPasswordPage />) },
      { path: '/reset-password/:token', element: page(<PasswordLinkPage link="reset" />) },
      { path: '/dev/perf', lazy: async () => ({ Component: (await import('@/features/perf-lab/components/perf-lab-page')).default }) },
      {
        path: '/c/:token',
        element: (
          <Suspense fallback={<p className="p-6">Loading…</p>}>
            <CustomerPage />
          </Suspense>
        ),
      },
      {
        element: <AppLayout />,
        children: [
          { index: true, element: <HomePage /> },
          { path: 'jobs', element: <JobsPage /> },
          { path: 'jobs/new', element: <NewJobPage /> },
          { path: 'jobs/:id', element: <BenchPage /> },
          { path: 'jobs/:id/review', element: <ReviewJobPage /> },
          { path: 'jobs/:id/repair', element: <RepairPage /> },
          { path: 'jobs/:id/report', element: <ReportPage /> },
          { path: 'jobs/:id/billing', element: <JobBillingPage /> },
          { path: 'jobs/:id/history', element: <JobHistoryPage /> },
          { path: 'jobs/:id/import', element: <MeterImportPage /> },
          { path: 'history', element: <SerialLookupPage /> },
          { path: 'parts-bin', element: <PartsBinPage /> },
          { path: 'stats', element: <StatsPage /> },
          { path: 'review', element: <ReviewQueuePage /> },
          { path: 'boards', element: <BoardLibraryPage /> },
          { path: 'boards/:id', element: <BoardEditorPage /> },
          { path: 'boards/:id/capture', element: <BoardCapturePage /> },
          { path: 'references', element: <ReferencesPage /> },
          { path: 'dev/mail', element: <MailOutboxPage /> },
          { path: 'billing/settings', element: <BillingSettingsPage /> },
          { path: 'customers', element: <CustomersPage /> },
          { path: 'customers/:id', element: <CustomerDetailPage /> },
          { path: 'people', element: <PeoplePage /> },
          { path: 'shop', element: <ShopPage /> },
          { path: 'shop/terms', element: <ServiceTermsPage /> },
          { path: 'account', element: <AccountPage /> },
        ],
      },
    ],
  },
]);
