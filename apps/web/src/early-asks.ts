import { askEarly } from './lib/api-client';
import { askOverviewEarly } from './app/routes/fleet/overview-loader';

/*
 * The first of the app's code to run (main.tsx imports it before anything else): a cold load of the fleet
 * overview asks for its figures and for who is signed in here, while the rest of the app's code is still being
 * set up and before the page's thirty-odd code chunks take the browser's connections. The server works them out
 * meanwhile; the root loader and the overview's loader ask by the same addresses, which sends no second request,
 * and each takes its answer once.
 */
if (/^\/fleet\/?$/.test(window.location.pathname)) {
  askEarly('/me');
  askOverviewEarly(new URLSearchParams(window.location.search));
}
