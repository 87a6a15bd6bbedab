/**
 * The route table. Every screen is a lazy module, so the first load carries only the shell;
 * each section has its own errorElement so one broken screen leaves the navigation usable.
 */
import { useState } from "react";
import { createBrowserRouter, RouterProvider, type RouteObject } from "react-router-dom";
import type { Role } from "@shared/schemas/auth";
import { paths } from "@/config/paths";
import { RequireAuth } from "@/lib/auth";
import { AppShell } from "@/layouts/app-shell";
import { AREA_ROLES } from "@/layouts/nav-items";
import { FullPageSpinner } from "@/components/ui/spinner";
import { SectionError } from "./routes/section-error";
import { NotFoundRoute } from "./routes/not-found";

type Lazy = NonNullable<RouteObject["lazy"]>;

/** One screen: a lazily loaded module plus the section error page. */
function screen(path: string | undefined, lazy: Lazy): RouteObject {
  return path === undefined
    ? { index: true, lazy, errorElement: <SectionError /> }
    : { path, lazy, errorElement: <SectionError /> };
}

/** Screens that need one of the given roles; the same roles as their menu entries. */
function restricted(roles: readonly Role[], children: RouteObject[]): RouteObject {
  return { element: <RequireAuth roles={roles} />, errorElement: <SectionError />, children };
}

export function createAppRouter() {
  return createBrowserRouter([
    {
      path: paths.signIn.path,
      lazy: () => import("./routes/sign-in").then((m) => ({ Component: m.SignInRoute })),
      errorElement: <SectionError />,
      hydrateFallbackElement: <FullPageSpinner />,
    },
    {
      path: paths.forgot.path,
      lazy: () => import("./routes/forgot-password").then((m) => ({ Component: m.ForgotPasswordRoute })),
      errorElement: <SectionError />,
      hydrateFallbackElement: <FullPageSpinner />,
    },
    {
      path: paths.reset.path,
      lazy: () => import("./routes/reset-password").then((m) => ({ Component: m.ResetPasswordRoute })),
      errorElement: <SectionError />,
      hydrateFallbackElement: <FullPageSpinner />,
    },
    {
      path: paths.home.path,
      element: (
        <RequireAuth>
          <AppShell />
        </RequireAuth>
      ),
      errorElement: <SectionError />,
      hydrateFallbackElement: <FullPageSpinner />,
      children: [
        screen(undefined, () => import("./routes/home").then((m) => ({ Component: m.HomeRoute }))),
        screen(paths.schedule.path, () => import("./routes/schedule").then((m) => ({ Component: m.ScheduleRoute }))),
        screen(paths.myBookings.path, () => import("./routes/my-bookings").then((m) => ({ Component: m.MyBookingsRoute }))),
        screen(paths.instruments.path, () => import("./routes/instruments").then((m) => ({ Component: m.InstrumentsRoute }))),
        screen(paths.instrument.path, () => import("./routes/instrument").then((m) => ({ Component: m.InstrumentRoute }))),
        screen(paths.stockroom.path, () => import("./routes/stockroom").then((m) => ({ Component: m.StockroomRoute }))),
        screen(paths.stockroomChemicals.path, () => import("./routes/stockroom").then((m) => ({ Component: m.ChemicalsRoute }))),
        screen(paths.chemical.path, () => import("./routes/stockroom-chemical").then((m) => ({ Component: m.ChemicalRoute }))),
        screen(paths.container.path, () => import("./routes/stockroom-container").then((m) => ({ Component: m.ContainerRoute }))),
        screen(paths.prepareSolution.path, () => import("./routes/stockroom-prepare").then((m) => ({ Component: m.PrepareSolutionRoute }))),
        screen(paths.runPlanNew.path, () => import("./routes/run-plan-new").then((m) => ({ Component: m.NewRunPlanRoute }))),
        screen(paths.runPlan.path, () => import("./routes/run-plan").then((m) => ({ Component: m.RunPlanRoute }))),
        screen(paths.scan.path, () => import("./routes/scan").then((m) => ({ Component: m.ScanRoute }))),
        screen(paths.scanToken.path, () => import("./routes/scan-token").then((m) => ({ Component: m.ScanTokenRoute }))),
        screen(paths.myCharges.path, () => import("./routes/my-charges").then((m) => ({ Component: m.MyChargesRoute }))),
        screen(paths.profile.path, () => import("./routes/profile").then((m) => ({ Component: m.ProfileRoute }))),
        restricted(AREA_ROLES.training, [
          screen(paths.training.path, () => import("./routes/training").then((m) => ({ Component: m.TrainingRoute }))),
          screen(paths.approvals.path, () => import("./routes/approvals").then((m) => ({ Component: m.ApprovalsRoute }))),
          screen(paths.utilisation.path, () => import("./routes/utilisation").then((m) => ({ Component: m.UtilisationRoute }))),
          screen(paths.scheduleSettings.path, () => import("./routes/schedule-settings").then((m) => ({ Component: m.ScheduleSettingsRoute }))),
        ]),
        restricted(AREA_ROLES.recharge, [
          screen(paths.recharge.path, () => import("./routes/recharge").then((m) => ({ Component: m.RechargeRoute }))),
        ]),
        restricted(AREA_ROLES.safety, [
          screen(paths.safety.path, () => import("./routes/safety").then((m) => ({ Component: m.SafetyRoute }))),
          screen(paths.safetyLocations.path, () => import("./routes/safety").then((m) => ({ Component: m.SafetyLocationsRoute }))),
          screen(paths.receive.path, () => import("./routes/stockroom-receive").then((m) => ({ Component: m.ReceiveRoute }))),
          screen(paths.stockImport.path, () => import("./routes/stockroom-import").then((m) => ({ Component: m.StockImportRoute }))),
        ]),
        restricted(AREA_ROLES.admin, [
          screen(paths.admin.people.path, () => import("./routes/admin/people").then((m) => ({ Component: m.PeopleRoute }))),
          screen(paths.admin.mailbox.path, () => import("./routes/admin/mailbox").then((m) => ({ Component: m.MailboxRoute }))),
        ]),
        { path: "*", element: <NotFoundRoute />, errorElement: <SectionError /> },
      ],
    },
  ]);
}

export function AppRouter() {
  // Created once per mounted app, not at import time, so tests or a remount get a fresh history listener.
  const [router] = useState(createAppRouter);
  return <RouterProvider router={router} />;
}
