import type { ComponentType } from 'react';
import { createBrowserRouter, Navigate } from 'react-router-dom';
import { paths } from '../config/paths';
import { PageSpinner } from '../components/ui/spinner';
import { RouteError } from './routes/route-error';

/** Each screen is its own chunk, loaded when its route is first opened. */
const screen =
  <M,>(load: () => Promise<M>, pick: (module: M) => ComponentType) =>
  async () => ({ Component: pick(await load()) });

export const router = createBrowserRouter([
  {
    errorElement: <RouteError />,
    hydrateFallbackElement: <PageSpinner />,
    children: [
      {
        lazy: screen(() => import('./routes/public-layout'), (m) => m.PublicLayout),
        children: [
          { path: paths.auth.signIn.path, lazy: screen(() => import('./routes/auth/sign-in'), (m) => m.SignInRoute) },
          { path: paths.auth.signUp.path, lazy: screen(() => import('./routes/auth/sign-up'), (m) => m.SignUpRoute) },
          { path: paths.auth.forgotPassword.path, lazy: screen(() => import('./routes/auth/forgot-password'), (m) => m.ForgotPasswordRoute) },
          { path: paths.auth.resetPassword.path, lazy: screen(() => import('./routes/auth/reset-password'), (m) => m.ResetPasswordRoute) },
          { path: paths.auth.invitation.path, lazy: screen(() => import('./routes/auth/invitation'), (m) => m.InvitationRoute) },
          { path: paths.publicShop.path, lazy: screen(() => import('./routes/public/shop-page'), (m) => m.PublicShopRoute) },
          { path: paths.publicVerify.path, lazy: screen(() => import('./routes/public/verify'), (m) => m.PublicVerifyRoute) },
        ],
      },
      {
        path: paths.home.path,
        lazy: screen(() => import('./routes/app/root'), (m) => m.AppRoot),
        children: [
          { index: true, lazy: screen(() => import('./routes/app/home'), (m) => m.HomeRoute) },
          { path: paths.admin.shops.path, lazy: screen(() => import('./routes/app/admin/shops'), (m) => m.AdminShopsRoute) },
          { path: paths.dev.mailbox.path, lazy: screen(() => import('./routes/dev/mailbox'), (m) => m.MailboxRoute) },
          { path: paths.jobs.path, lazy: screen(() => import('./routes/app/jobs/list'), (m) => m.JobsRoute) },
          { path: paths.newJob.path, lazy: screen(() => import('./routes/app/jobs/new'), (m) => m.NewJobRoute) },
          { path: paths.job.path, lazy: screen(() => import('./routes/app/jobs/job'), (m) => m.JobRoute) },
          { path: paths.fileDiff.path, lazy: screen(() => import('./routes/app/files/diff'), (m) => m.FileDiffRoute) },
          { path: paths.vehicles.path, lazy: screen(() => import('./routes/app/vehicles/list'), (m) => m.VehiclesRoute) },
          { path: paths.vehicle.path, lazy: screen(() => import('./routes/app/vehicles/detail'), (m) => m.VehicleRoute) },
          { path: paths.customers.path, lazy: screen(() => import('./routes/app/customers/list'), (m) => m.CustomersRoute) },
          { path: paths.customer.path, lazy: screen(() => import('./routes/app/customers/detail'), (m) => m.CustomerRoute) },
          { path: paths.team.path, lazy: screen(() => import('./routes/app/team'), (m) => m.TeamRoute) },
          { path: paths.reports.path, lazy: screen(() => import('./routes/app/reports'), (m) => m.ReportsRoute) },
          { path: paths.kits.list.path, lazy: screen(() => import('./routes/app/kits/list'), (m) => m.KitsRoute) },
          { path: paths.kits.overview.path, lazy: screen(() => import('./routes/app/kits/overview'), (m) => m.KitOverviewRoute) },
          { path: paths.kits.detail.path, lazy: screen(() => import('./routes/app/kits/detail'), (m) => m.KitRoute) },
          { path: paths.dealers.list.path, lazy: screen(() => import('./routes/app/dealers/list'), (m) => m.DealersRoute) },
          { path: paths.dealers.detail.path, lazy: screen(() => import('./routes/app/dealers/detail'), (m) => m.DealerRoute) },
          {
            path: paths.settings.root.path,
            lazy: screen(() => import('./routes/app/settings/layout'), (m) => m.SettingsLayout),
            children: [
              { index: true, element: <Navigate to={paths.settings.profile.getHref()} replace /> },
              { path: paths.settings.profile.path, lazy: screen(() => import('./routes/app/settings/profile'), (m) => m.ProfileRoute) },
              { path: paths.settings.shop.path, lazy: screen(() => import('./routes/app/settings/shop'), (m) => m.ShopSettingsRoute) },
              { path: paths.settings.packages.path, lazy: screen(() => import('./routes/app/settings/packages'), (m) => m.PackagesSettingsRoute) },
              { path: paths.settings.notifications.path, lazy: screen(() => import('./routes/app/settings/notifications'), (m) => m.NotificationsSettingsRoute) },
            ],
          },
          { path: paths.datalogs.report.path, lazy: screen(() => import('./routes/app/datalogs/report'), (m) => m.DatalogReportRoute) },
          { path: paths.datalogs.jobLogs.path, lazy: screen(() => import('./routes/app/datalogs/job-logs'), (m) => m.JobLogsRoute) },
          { path: paths.billing.shop.path, lazy: screen(() => import('./routes/app/billing/shop-billing'), (m) => m.ShopBillingRoute) },
          { path: paths.billing.myStatement.path, lazy: screen(() => import('./routes/app/billing/dealer-statement'), (m) => m.DealerStatementRoute) },
          { path: paths.billing.statement.path, lazy: screen(() => import('./routes/app/billing/dealer-statement'), (m) => m.DealerStatementRoute) },
          { path: paths.admin.revenue.path, lazy: screen(() => import('./routes/app/billing/revenue'), (m) => m.RevenueRoute) },
          { id: 'not-found', path: '*', lazy: screen(() => import('./routes/not-found'), (m) => m.NotFoundRoute) },
        ],
      },
    ],
  },
]);
