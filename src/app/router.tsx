/**
 * The route table. Every screen is lazy twice over: its code (`Component`) and its loader, which
 * React Router fetches side by side. The loader modules are small (they import only the screens'
 * `queryOptions`), so a screen's queries start while its code is still on the way
 * (loaders/load.ts). The first load carries only the router and the session; even the signed-in
 * frame (app-shell) is its own chunk, so the sign-in page stays light. Links warm the next
 * screen's code when the pointer rests on them or they get the keyboard's focus (prefetch.ts).
 * Each section has its own errorElement so one broken screen leaves the navigation usable.
 */
import { useEffect, useState, type ComponentType } from "react";
import {
  RouterProvider,
  UNSAFE_createBrowserHistory as createBrowserHistory,
  UNSAFE_createRouter as createRouter,
  UNSAFE_hydrationRouteProperties as hydrationRouteProperties,
  UNSAFE_mapRouteProperties as mapRouteProperties,
  type LoaderFunctionArgs,
  type RouteObject,
} from "react-router-dom";
import { useQueryClient, type QueryClient } from "@tanstack/react-query";
import type { Role } from "@shared/schemas/auth";
import { paths } from "@/config/paths";
import { RequireAuth } from "@/lib/auth";
import { meQueryOptions } from "@/lib/session/get-me";
import { AREA_ROLES } from "@/layouts/nav-items";
import { FullPageSpinner } from "@/components/ui/spinner";
import { SectionError } from "./routes/section-error";
import { NotFoundRoute } from "./routes/not-found";
import { runLoader, type ScreenLoader } from "./loaders/load";
import { warmLinksOnIntent } from "./prefetch";

type Code = () => Promise<ComponentType>;
type Data = () => Promise<ScreenLoader>;

const schedule = () => import("./loaders/schedule-data");
const stockroom = () => import("./loaders/stockroom-data");
const areas = () => import("./loaders/areas-data");
const safety = () => import("./loaders/safety-data");
const labels = () => import("./loaders/labels-data");

/**
 * The app's router, not yet started: `router.initialize()` matches the first address and starts
 * its loaders. This is what createBrowserRouter does in one step; main.tsx takes the two steps in
 * tasks of their own, so neither holds a slow phone's main thread for long (building the router
 * ranks every route, starting it matches them again and starts the screen's code and data).
 */
export function createAppRouter(qc: QueryClient) {
  // Until the router has shown its first screen, loaders do not wait for data (loaders/load.ts).
  let opened = false;

  /** One screen: its code, its data (optional), the section error page; `roles` as its guard. */
  const screen = (path: string | undefined, code: Code, data?: Data, roles?: readonly Role[]): RouteObject => ({
    ...(path === undefined ? { index: true as const } : { path }),
    errorElement: <SectionError />,
    lazy: {
      Component: code,
      ...(data && {
        loader: async () => {
          const load = await data();
          return (args: LoaderFunctionArgs) => runLoader(qc, args, load, roles, !opened);
        },
      }),
    },
  });

  /** Screens that need one of the given roles; the same roles as their menu entries. */
  const restricted = (roles: readonly Role[], children: [string, Code, Data?][]): RouteObject => ({
    element: <RequireAuth roles={roles} />,
    errorElement: <SectionError />,
    children: children.map(([path, code, data]) => screen(path, code, data, roles)),
  });

  // Who is signed in is asked at once, beside the screen's code, not after it arrives: the
  // signed-out pages open straight on their form (or move on), the frame straight on its screen.
  const session = async () => {
    await qc.prefetchQuery(meQueryOptions());
    return null;
  };

  const signedOut = (path: string, code: Code): RouteObject => ({
    path,
    loader: session,
    lazy: { Component: code },
    errorElement: <SectionError />,
    hydrateFallbackElement: <FullPageSpinner />,
  });

  const routes: RouteObject[] = [
    signedOut(paths.signIn.path, () => import("./routes/sign-in").then((m) => m.SignInRoute)),
    signedOut(paths.forgot.path, () => import("./routes/forgot-password").then((m) => m.ForgotPasswordRoute)),
    signedOut(paths.reset.path, () => import("./routes/reset-password").then((m) => m.ResetPasswordRoute)),
    {
      path: paths.home.path,
      loader: session,
      lazy: { Component: () => import("./routes/signed-in-frame").then((m) => m.SignedInFrame) },
      errorElement: <SectionError />,
      hydrateFallbackElement: <FullPageSpinner />,
      children: [
        screen(undefined, () => import("./routes/home").then((m) => m.HomeRoute), () => areas().then((m) => m.home)),
        screen(paths.schedule.path, () => import("./routes/schedule").then((m) => m.ScheduleRoute), () => schedule().then((m) => m.schedule)),
        screen(paths.myBookings.path, () => import("./routes/my-bookings").then((m) => m.MyBookingsRoute), () => schedule().then((m) => m.myBookings)),
        screen(paths.instruments.path, () => import("./routes/instruments").then((m) => m.InstrumentsRoute), () => schedule().then((m) => m.instruments)),
        screen(paths.instrument.path, () => import("./routes/instrument").then((m) => m.InstrumentRoute), () => schedule().then((m) => m.instrument)),
        screen(paths.stockroom.path, () => import("./routes/stockroom").then((m) => m.StockroomRoute), () => stockroom().then((m) => m.containers)),
        screen(paths.stockroomChemicals.path, () => import("./routes/stockroom").then((m) => m.ChemicalsRoute), () => stockroom().then((m) => m.chemicals)),
        screen(paths.chemical.path, () => import("./routes/stockroom-chemical").then((m) => m.ChemicalRoute), () => stockroom().then((m) => m.chemical)),
        screen(paths.container.path, () => import("./routes/stockroom-container").then((m) => m.ContainerRoute), () => stockroom().then((m) => m.container)),
        screen(paths.prepareSolution.path, () => import("./routes/stockroom-prepare").then((m) => m.PrepareSolutionRoute), () => stockroom().then((m) => m.prepare)),
        screen(paths.runPlanNew.path, () => import("./routes/run-plan-new").then((m) => m.NewRunPlanRoute)),
        screen(paths.runPlan.path, () => import("./routes/run-plan").then((m) => m.RunPlanRoute)),
        screen(paths.scan.path, () => import("./routes/scan").then((m) => m.ScanRoute)),
        screen(paths.scanToken.path, () => import("./routes/scan-token").then((m) => m.ScanTokenRoute), () => labels().then((m) => m.scanToken)),
        screen(paths.myCharges.path, () => import("./routes/my-charges").then((m) => m.MyChargesRoute)),
        screen(paths.profile.path, () => import("./routes/profile").then((m) => m.ProfileRoute)),
        restricted(AREA_ROLES.training, [
          [paths.training.path, () => import("./routes/training").then((m) => m.TrainingRoute), () => schedule().then((m) => m.training)],
          [paths.approvals.path, () => import("./routes/approvals").then((m) => m.ApprovalsRoute), () => schedule().then((m) => m.approvals)],
          [paths.utilisation.path, () => import("./routes/utilisation").then((m) => m.UtilisationRoute)],
          [paths.scheduleSettings.path, () => import("./routes/schedule-settings").then((m) => m.ScheduleSettingsRoute), () => schedule().then((m) => m.scheduleSettings)],
        ]),
        restricted(AREA_ROLES.recharge, [[paths.recharge.path, () => import("./routes/recharge").then((m) => m.RechargeRoute)]]),
        restricted(AREA_ROLES.safety, [
          [paths.safety.path, () => import("./routes/safety").then((m) => m.SafetyRoute), () => safety().then((m) => m.safety)],
          [paths.safetyLocations.path, () => import("./routes/safety-locations").then((m) => m.SafetyLocationsRoute), () => safety().then((m) => m.safetyLocations)],
          [paths.receive.path, () => import("./routes/stockroom-receive").then((m) => m.ReceiveRoute), () => stockroom().then((m) => m.receive)],
          [paths.stockImport.path, () => import("./routes/stockroom-import").then((m) => m.StockImportRoute)],
        ]),
        restricted(AREA_ROLES.admin, [
          [paths.admin.people.path, () => import("./routes/admin/people").then((m) => m.PeopleRoute), () => areas().then((m) => m.people)],
          [paths.admin.mailbox.path, () => import("./routes/admin/mailbox").then((m) => m.MailboxRoute), () => areas().then((m) => m.system)],
        ]),
        { path: "*", element: <NotFoundRoute />, errorElement: <SectionError /> },
      ],
    },
  ];
  const router = createRouter({ routes, history: createBrowserHistory(), mapRouteProperties, hydrationRouteProperties });
  void routerReady(router).then(() => (opened = true));
  return router;
}

export type AppRouterInstance = ReturnType<typeof createAppRouter>;

/** Resolves once the router has matched the first address, run its loaders and loaded its screen's code. */
export function routerReady(router: AppRouterInstance): Promise<void> {
  if (router.state.initialized) return Promise.resolve();
  return new Promise((resolve) => {
    const stop = router.subscribe((state) => {
      if (!state.initialized) return;
      stop();
      resolve();
    });
  });
}

/**
 * The router, created once per mounted app (main.tsx makes and starts it before the first render,
 * so the first screen is ready when React first paints; without one, as in tests, it is made and
 * started here).
 */
export function AppRouter({ router: given }: { router?: AppRouterInstance }) {
  const qc = useQueryClient();
  const [router] = useState(() => given ?? createAppRouter(qc).initialize());
  useEffect(() => warmLinksOnIntent(router.routes), [router]);
  return <RouterProvider router={router} />;
}
