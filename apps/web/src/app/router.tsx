import { createBrowserRouter, type RouteObject } from 'react-router-dom';
import type { QueryClient } from '@tanstack/react-query';
import { homeLoader, rootLoader } from './root-loader';
import { AppShell } from './shell/app-shell';
import { NotFoundPage } from './routes/errors/not-found-page';
import { RouteError } from './routes/errors/route-error';
import { overviewLoader } from './routes/fleet/overview-loader';

/** What shows while the first page's code and data arrive. */
function FirstLoad() {
  return (
    <p role="status" className="px-4 py-10 text-center text-ink-muted">
      Loading Kerfline…
    </p>
  );
}

/**
 * Every page of the web app. The router decides when to load (each loader calls `ensureQueryData`); the
 * query cache owns the data and the pages read it with the same query options. Pages are split into their
 * own chunks so the first load carries only the shell.
 */
export function appRoutes(queryClient: QueryClient): RouteObject[] {
  return [
    {
      path: '/sign-in',
      errorElement: <RouteError />,
      hydrateFallbackElement: <FirstLoad />,
      lazy: async () => ({ Component: (await import('./routes/auth/sign-in-page')).SignInPage }),
    },
    {
      path: '/forgot-password',
      errorElement: <RouteError />,
      hydrateFallbackElement: <FirstLoad />,
      lazy: async () => ({ Component: (await import('./routes/auth/forgot-password-page')).ForgotPasswordPage }),
    },
    {
      path: '/reset-password',
      errorElement: <RouteError />,
      hydrateFallbackElement: <FirstLoad />,
      lazy: async () => ({ Component: (await import('./routes/auth/reset-password-page')).ResetPasswordPage }),
    },
    {
      path: '/invitation',
      errorElement: <RouteError />,
      hydrateFallbackElement: <FirstLoad />,
      lazy: async () => ({ Component: (await import('./routes/auth/invitation-page')).InvitationPage }),
    },
    {
      id: 'root',
      path: '/',
      loader: rootLoader(queryClient),
      element: <AppShell />,
      hydrateFallbackElement: <FirstLoad />,
      // A failure of the root loader itself (the server down, say): no shell to draw it in.
      errorElement: <RouteError />,
      children: [
        {
          // Page failures render inside the shell, so the navigation stays.
          errorElement: <RouteError />,
          children: [
            { index: true, loader: homeLoader(queryClient) },
            {
              path: 'sites',
              lazy: async () => {
                const page = await import('./routes/sites/sites-page');
                return { loader: page.sitesLoader(queryClient), Component: page.SitesPage };
              },
            },
            {
              path: 'sites/new',
              lazy: async () => {
                const page = await import('./routes/sites/site-new-page');
                return { loader: page.siteNewPageLoader(queryClient), Component: page.SiteNewPage };
              },
            },
            {
              path: 'sites/:siteId',
              lazy: async () => {
                const page = await import('./routes/sites/site-page');
                return { loader: page.sitePageLoader(queryClient), Component: page.SitePage };
              },
            },
            {
              path: 'sites/:siteId/settings',
              lazy: async () => {
                const page = await import('./routes/sites/site-settings-page');
                return { loader: page.siteSettingsPageLoader(queryClient), Component: page.SiteSettingsPage };
              },
            },
            {
              path: 'sites/:siteId/checks',
              lazy: async () => {
                const page = await import('./routes/checks/site-checks-page');
                return { loader: page.siteChecksPageLoader(queryClient), Component: page.SiteChecksPage };
              },
            },
            {
              path: 'sites/:siteId/checks/overdue',
              lazy: async () => {
                const page = await import('./routes/checks/site-overdue-checks-page');
                return {
                  loader: page.siteOverdueChecksPageLoader(queryClient),
                  Component: page.SiteOverdueChecksPage,
                };
              },
            },
            {
              path: 'sites/:siteId/edit',
              lazy: async () => {
                const page = await import('./routes/sites/site-edit-page');
                return { loader: page.siteEditPageLoader(queryClient), Component: page.SiteEditPage };
              },
            },
            {
              path: 'saws',
              lazy: async () => {
                const page = await import('./routes/saws/saws-page');
                return { loader: page.sawsPageLoader(queryClient), Component: page.SawsPage };
              },
            },
            {
              path: 'saws/new',
              lazy: async () => {
                const page = await import('./routes/saws/saw-new-page');
                return { loader: page.sawNewPageLoader(queryClient), Component: page.SawNewPage };
              },
            },
            {
              path: 'saws/:sawId',
              lazy: async () => {
                const page = await import('./routes/saws/saw-page');
                return { loader: page.sawPageLoader(queryClient), Component: page.SawPage };
              },
            },
            {
              path: 'saws/:sawId/record-check',
              lazy: async () => {
                const page = await import('./routes/checks/record-check-page');
                return { loader: page.recordCheckPageLoader(queryClient), Component: page.RecordCheckPage };
              },
            },
            {
              path: 'saws/:sawId/edit',
              lazy: async () => {
                const page = await import('./routes/saws/saw-edit-page');
                return { loader: page.sawEditPageLoader(queryClient), Component: page.SawEditPage };
              },
            },
            {
              path: 'today',
              lazy: async () => {
                const page = await import('./routes/today/today-page');
                return { loader: page.todayPageLoader(queryClient), Component: page.TodayPage };
              },
            },
            {
              path: 'saws/:sawId/blade-on',
              lazy: async () => {
                const page = await import('./routes/saws/blade-on-page');
                return { loader: page.bladeOnPageLoader(queryClient), Component: page.BladeOnPage };
              },
            },
            {
              path: 'saws/:sawId/blade-off',
              lazy: async () => {
                const page = await import('./routes/saws/blade-off-page');
                return { loader: page.bladeOffPageLoader(queryClient), Component: page.BladeOffPage };
              },
            },
            {
              path: 'saws/:sawId/stops/new',
              lazy: async () => {
                const page = await import('./routes/saws/stop-new-page');
                return { loader: page.stopNewPageLoader(queryClient), Component: page.StopNewPage };
              },
            },
            {
              path: 'saws/:sawId/stop-end',
              lazy: async () => {
                const page = await import('./routes/saws/stop-end-page');
                return { loader: page.stopEndPageLoader(queryClient), Component: page.StopEndPage };
              },
            },
            {
              path: 'saws/:sawId/cut-logs/new',
              lazy: async () => {
                const page = await import('./routes/saws/cut-log-new-page');
                return { loader: page.cutLogNewPageLoader(queryClient), Component: page.CutLogNewPage };
              },
            },
            {
              path: 'blade-runs/:runId',
              lazy: async () => {
                const page = await import('./routes/records/blade-run-page');
                return { loader: page.bladeRunPageLoader(queryClient), Component: page.BladeRunPage };
              },
            },
            {
              path: 'stops/:stopId',
              lazy: async () => {
                const page = await import('./routes/records/stop-page');
                return { loader: page.stopPageLoader(queryClient), Component: page.StopPage };
              },
            },
            {
              path: 'sites/:siteId/blade-runs',
              lazy: async () => {
                const page = await import('./routes/sites/site-blade-runs-page');
                return { loader: page.siteBladeRunsPageLoader(queryClient), Component: page.SiteBladeRunsPage };
              },
            },
            {
              path: 'sites/:siteId/stops',
              lazy: async () => {
                const page = await import('./routes/sites/site-stops-page');
                return { loader: page.siteStopsPageLoader(queryClient), Component: page.SiteStopsPage };
              },
            },
            {
              path: 'sites/:siteId/check-records',
              lazy: async () => {
                const page = await import('./routes/checks/site-check-records-page');
                return { loader: page.siteCheckRecordsPageLoader(queryClient), Component: page.SiteCheckRecordsPage };
              },
            },
            {
              path: 'sites/:siteId/stock',
              lazy: async () => {
                const page = await import('./routes/sites/site-stock-page');
                return { loader: page.siteStockPageLoader(queryClient), Component: page.SiteStockPage };
              },
            },
            {
              path: 'sites/:siteId/stock/receive',
              lazy: async () => {
                const page = await import('./routes/sites/stock-receive-page');
                return { loader: page.stockReceivePageLoader(queryClient), Component: page.StockReceivePage };
              },
            },
            {
              path: 'sites/:siteId/stock/movements',
              lazy: async () => {
                const page = await import('./routes/sites/stock-movements-page');
                return { loader: page.stockMovementsPageLoader(queryClient), Component: page.StockMovementsPage };
              },
            },
            {
              path: 'sites/:siteId/history',
              lazy: async () => {
                const page = await import('./routes/sites/site-history-page');
                return { loader: page.siteHistoryPageLoader(queryClient), Component: page.SiteHistoryPage };
              },
            },
            {
              path: 'sites/:siteId/removed',
              lazy: async () => {
                const page = await import('./routes/sites/site-removed-page');
                return { loader: page.siteRemovedPageLoader(queryClient), Component: page.SiteRemovedPage };
              },
            },
            {
              path: 'blade-specs',
              lazy: async () => {
                const page = await import('./routes/blade-specs/blade-specs-page');
                return { loader: page.bladeSpecsPageLoader(queryClient), Component: page.BladeSpecsPage };
              },
            },
            {
              path: 'blade-specs/new',
              lazy: async () => {
                const page = await import('./routes/blade-specs/blade-spec-form-pages');
                return { loader: page.bladeSpecNewPageLoader(queryClient), Component: page.BladeSpecNewPage };
              },
            },
            {
              path: 'blade-specs/:specId/edit',
              lazy: async () => {
                const page = await import('./routes/blade-specs/blade-spec-form-pages');
                return { loader: page.bladeSpecEditPageLoader(queryClient), Component: page.BladeSpecEditPage };
              },
            },
            {
              path: 'account',
              lazy: async () => ({ Component: (await import('./routes/auth/account-page')).AccountPage }),
            },
            {
              path: 'people',
              lazy: async () => {
                const page = await import('./routes/people/people-page');
                return { loader: page.peoplePageLoader(queryClient), Component: page.PeoplePage };
              },
            },
            {
              path: 'people/new',
              lazy: async () => {
                const page = await import('./routes/people/person-new-page');
                return { loader: page.personNewPageLoader(queryClient), Component: page.PersonNewPage };
              },
            },
            {
              path: 'people/invite',
              lazy: async () => {
                const page = await import('./routes/people/person-invite-page');
                return { loader: page.personInvitePageLoader(queryClient), Component: page.PersonInvitePage };
              },
            },
            {
              path: 'people/:userId',
              lazy: async () => {
                const page = await import('./routes/people/person-page');
                return { loader: page.personPageLoader(queryClient), Component: page.PersonPage };
              },
            },
            {
              path: 'mail',
              lazy: async () => {
                const page = await import('./routes/mail/mail-page');
                return { loader: page.mailPageLoader(queryClient), Component: page.MailPage };
              },
            },
            {
              path: 'imports',
              lazy: async () => {
                const page = await import('./routes/imports/imports-page');
                return { loader: page.importsPageLoader(queryClient), Component: page.ImportsPage };
              },
            },
            {
              path: 'imports/new',
              lazy: async () => {
                const page = await import('./routes/imports/import-new-page');
                return { loader: page.importNewPageLoader(queryClient), Component: page.ImportNewPage };
              },
            },
            {
              path: 'imports/:importId',
              lazy: async () => {
                const page = await import('./routes/imports/import-page');
                return { loader: page.importPageLoader(queryClient), Component: page.ImportPage };
              },
            },
            {
              path: 'calculators',
              lazy: async () => {
                const page = await import('./routes/calculators/calculators-page');
                return { loader: page.calculatorsLoader(queryClient), Component: page.CalculatorsLayout };
              },
              children: [
                {
                  index: true,
                  lazy: async () => ({
                    Component: (await import('./routes/calculators/calculators-page')).CalculatorsIndexPage,
                  }),
                },
                {
                  path: ':calculator',
                  lazy: async () => {
                    const page = await import('./routes/calculators/calculator-page');
                    return { loader: page.calculatorPageLoader(queryClient), Component: page.CalculatorPage };
                  },
                },
              ],
            },
            {
              // The manager's home: its loader is in the first chunk so the figures and the chart code are asked
              // for as the address matches, while the page's own code loads (see overview-loader.ts).
              path: 'fleet',
              loader: overviewLoader(queryClient),
              lazy: async () => ({ Component: (await import('./routes/fleet/overview-page')).OverviewPage }),
            },
            {
              path: 'fleet/practice',
              lazy: async () => {
                const page = await import('./routes/fleet/practice-page');
                return { loader: page.practiceLoader(queryClient), Component: page.PracticePage };
              },
            },
            {
              path: 'fleet/sites/:siteId',
              lazy: async () => {
                const page = await import('./routes/fleet/site-figures-page');
                return { loader: page.siteFiguresLoader(queryClient), Component: page.SiteFiguresPage };
              },
            },
            {
              path: 'fleet/saws/:sawId',
              lazy: async () => {
                const page = await import('./routes/fleet/saw-figures-page');
                return { loader: page.sawFiguresLoader(queryClient), Component: page.SawFiguresPage };
              },
            },
            {
              path: 'fleet/runs/:runId',
              lazy: async () => {
                const page = await import('./routes/fleet/run-page');
                return { loader: page.runPageLoader(queryClient), Component: page.RunPage };
              },
            },
            {
              path: 'outliers',
              lazy: async () => {
                const page = await import('./routes/outliers/outliers-page');
                return { loader: page.outliersLoader(queryClient), Component: page.OutliersPage };
              },
            },
            {
              path: 'outliers/saws/:sawId',
              lazy: async () => {
                const page = await import('./routes/outliers/saw-outlier-page');
                return { loader: page.sawOutlierLoader(queryClient), Component: page.SawOutlierPage };
              },
            },
            {
              path: 'follow-ups',
              lazy: async () => {
                const page = await import('./routes/follow-ups/follow-ups-page');
                return { loader: page.followUpsLoader(queryClient), Component: page.FollowUpsPage };
              },
            },
            {
              path: 'follow-ups/:followUpId',
              lazy: async () => {
                const page = await import('./routes/follow-ups/follow-up-page');
                return { loader: page.followUpLoader(queryClient), Component: page.FollowUpPage };
              },
            },
            {
              path: 'budgets',
              lazy: async () => {
                const page = await import('./routes/money/budgets-page');
                return { loader: page.budgetsLoader(queryClient), Component: page.BudgetsPage };
              },
            },
            {
              path: 'exchange-rates',
              lazy: async () => {
                const page = await import('./routes/money/exchange-rates-page');
                return { loader: page.exchangeRatesLoader(queryClient), Component: page.ExchangeRatesPage };
              },
            },
            { path: '*', element: <NotFoundPage /> },
          ],
        },
      ],
    },
  ];
}

export function createAppRouter(queryClient: QueryClient) {
  return createBrowserRouter(appRoutes(queryClient));
}
