import { type ReactNode, Suspense } from 'react';
import { createBrowserRouter } from 'react-router';
import { RouteErrorBoundary, ErrorView } from '@/components/errors/error-view';
import { Loading } from '@/components/ui/card';
import { RequireAuth, RequireRole, NotAllowed } from './routes/auth/require-auth';
import { paths } from '@/config/paths';
import { queryClient } from '@/lib/query-client';
import { stripQueryOptions } from '@/features/testing/api/get-strip';
import { meQueryOptions } from '@/features/auth/api/get-me';
import { lazyPage } from './lazy-page';
import { StripClock, VenueClock } from './venue-clock';

const SignIn = lazyPage(() => import('./routes/auth/sign-in'));
const SetPassword = lazyPage(() => import('./routes/auth/set-password'));
const ResetPassword = lazyPage(() => import('./routes/auth/reset-password'));
const Home = lazyPage(() => import('./routes/home/home'));
const People = lazyPage(() => import('./routes/admin/people'));
const Outbox = lazyPage(() => import('./routes/admin/outbox'));
const Venue = lazyPage(() => import('./routes/venues/venue'));
const VenueBoard = lazyPage(() => import('./routes/venues/board'));
const StripTest = lazyPage(() => import('./routes/testing/strip-test'));
const OnThisTablet = lazyPage(() => import('./routes/testing/on-this-tablet'));
const Fault = lazyPage(() => import('./routes/faults/fault'));
const EquipmentRegister = lazyPage(() => import('./routes/equipment/register'));
const EquipmentItem = lazyPage(() => import('./routes/equipment/item'));
const EquipmentImport = lazyPage(() => import('./routes/equipment/import'));
const Events = lazyPage(() => import('./routes/events/events'));
const EventPage = lazyPage(() => import('./routes/events/event'));
const VenuePlan = lazyPage(() => import('./routes/venues/plan'));
const VenueReadings = lazyPage(() => import('./routes/venues/readings'));
const VenueAudit = lazyPage(() => import('./routes/venues/audit'));
const Profiles = lazyPage(() => import('./routes/profiles/profiles'));
const Profile = lazyPage(() => import('./routes/profiles/profile'));
const FaultLocator = lazyPage(() => import('./routes/tools/fault-locator'));
const SignOff = lazyPage(() => import('./routes/venues/sign-off'));
const Certificates = lazyPage(() => import('./routes/venues/certificates'));
const VenueIncidents = lazyPage(() => import('./routes/venues/incidents'));
const VenueSpares = lazyPage(() => import('./routes/venues/spares'));
const Verify = lazyPage(() => import('./routes/verify/verify'));
const ScannedTag = lazyPage(() => import('./routes/labels/scanned-tag'));
const ScannedStrip = lazyPage(() => import('./routes/labels/scanned-strip'));

const page = (node: ReactNode) => <Suspense fallback={<Loading />}>{node}</Suspense>;

export const router = createBrowserRouter([
  { path: paths.signIn, element: page(<SignIn />), errorElement: <RouteErrorBoundary /> },
  { path: paths.setPassword(), element: page(<SetPassword />), errorElement: <RouteErrorBoundary /> },
  { path: paths.resetPassword, element: page(<ResetPassword />), errorElement: <RouteErrorBoundary /> },
  // Public: anyone holding a certificate may check it, without signing in.
  { path: paths.verifyLookup, element: page(<Verify />), errorElement: <RouteErrorBoundary /> },
  { path: paths.verify(), element: page(<Verify />), errorElement: <RouteErrorBoundary /> },
  {
    element: <RequireAuth />,
    // Who is signed in, asked with the navigation: the guard would otherwise ask only once the
    // tablet's saved copy has been read back (TanStack Query holds queries until then).
    loader: () => {
      void queryClient.prefetchQuery(meQueryOptions());
      return null;
    },
    errorElement: <RouteErrorBoundary />,
    children: [
      { index: true, element: page(<Home />), errorElement: <RouteErrorBoundary /> },
      { path: paths.notAllowed, element: <NotAllowed /> },
      {
        path: paths.venue(),
        element: page(
          <VenueClock>
            <Venue />
          </VenueClock>,
        ),
        errorElement: <RouteErrorBoundary />,
      },
      {
        path: paths.venueBoard(),
        element: page(
          <VenueClock>
            <VenueBoard />
          </VenueClock>,
        ),
        errorElement: <RouteErrorBoundary />,
      },
      {
        path: paths.stripTest(),
        // Both started with the navigation, beside the sign-in check, instead of one after the
        // other once it has answered: the screen's code and its strip (paused while offline, when
        // the strip comes from the tablet's saved copy). Nothing is awaited: the screen shows at once.
        loader: ({ params }) => {
          void StripTest.preload().catch(() => undefined);
          void queryClient.prefetchQuery(stripQueryOptions(params.stripId ?? ''));
          return null;
        },
        element: page(
          <StripClock>
            <StripTest />
          </StripClock>,
        ),
        errorElement: <RouteErrorBoundary />,
      },
      { path: paths.scannedStrip, element: page(<ScannedStrip />), errorElement: <RouteErrorBoundary /> },
      { path: paths.scannedTag, element: page(<ScannedTag />), errorElement: <RouteErrorBoundary /> },
      { path: paths.onThisTablet, element: page(<OnThisTablet />), errorElement: <RouteErrorBoundary /> },
      { path: paths.fault(), element: page(<Fault />), errorElement: <RouteErrorBoundary /> },
      { path: paths.equipment, element: page(<EquipmentRegister />), errorElement: <RouteErrorBoundary /> },
      { path: paths.equipmentItem(), element: page(<EquipmentItem />), errorElement: <RouteErrorBoundary /> },
      {
        element: <RequireRole roles={['admin', 'director']} />,
        children: [{ path: paths.equipmentImport, element: page(<EquipmentImport />), errorElement: <RouteErrorBoundary /> }],
      },
      { path: paths.events, element: page(<Events />), errorElement: <RouteErrorBoundary /> },
      { path: paths.event(), element: page(<EventPage />), errorElement: <RouteErrorBoundary /> },
      {
        path: paths.venuePlan(),
        element: page(
          <VenueClock>
            <VenuePlan />
          </VenueClock>,
        ),
        errorElement: <RouteErrorBoundary />,
      },
      {
        path: paths.venueReadings(),
        element: page(
          <VenueClock>
            <VenueReadings />
          </VenueClock>,
        ),
        errorElement: <RouteErrorBoundary />,
      },
      { path: paths.profiles, element: page(<Profiles />), errorElement: <RouteErrorBoundary /> },
      { path: paths.profile(), element: page(<Profile />), errorElement: <RouteErrorBoundary /> },
      { path: paths.faultLocator, element: page(<FaultLocator />), errorElement: <RouteErrorBoundary /> },
      {
        path: paths.venueSignOff(),
        element: page(
          <VenueClock>
            <SignOff />
          </VenueClock>,
        ),
        errorElement: <RouteErrorBoundary />,
      },
      {
        path: paths.venueCertificates(),
        element: page(
          <VenueClock>
            <Certificates />
          </VenueClock>,
        ),
        errorElement: <RouteErrorBoundary />,
      },
      {
        path: paths.venueIncidents(),
        element: page(
          <VenueClock>
            <VenueIncidents />
          </VenueClock>,
        ),
        errorElement: <RouteErrorBoundary />,
      },
      {
        path: paths.venueSpares(),
        element: page(
          <VenueClock>
            <VenueSpares />
          </VenueClock>,
        ),
        errorElement: <RouteErrorBoundary />,
      },
      {
        element: <RequireRole roles={['admin', 'director', 'organiser']} />,
        children: [
          {
            path: paths.venueAudit(),
            element: page(
              <VenueClock>
                <VenueAudit />
              </VenueClock>,
            ),
            errorElement: <RouteErrorBoundary />,
          },
        ],
      },
      {
        element: <RequireRole roles={['admin']} />,
        children: [
          { path: paths.people, element: page(<People />), errorElement: <RouteErrorBoundary /> },
          { path: paths.outbox, element: page(<Outbox />), errorElement: <RouteErrorBoundary /> },
        ],
      },
      { path: '*', element: <ErrorView title="Page not found" message="There is nothing at this address." /> },
    ],
  },
]);
