import { useQueryClient } from '@tanstack/react-query';
import { ctx } from 'expo-router/_ctx';
import { useEffect } from 'react';
import { loadSchemaKit } from './schemas';

let started = false;

/**
 * Once the first screen is up and the browser is idle, fetch the schema kit and every screen's
 * code (on the web each route is its own chunk), so a screen opened later works without a
 * connection: a technician who loads the app on Wi-Fi can still open the timer at the burn bench.
 * The chart code is not fetched: charts draw rankings, which need the server anyway.
 * On a phone the routes are in the one bundle and this only loads the kit.
 */
function preloadWhenIdle(busy: () => boolean): void {
  if (started) return;
  started = true;
  const run = async () => {
    await loadSchemaKit().catch(() => undefined);
    for (const key of ctx.keys()) {
      // A failure (offline) leaves that screen to load when it is opened.
      await Promise.resolve()
        .then(() => ctx(key))
        .catch(() => undefined);
    }
  };
  const whenIdle: (run: () => void) => void =
    typeof requestIdleCallback === 'function'
      ? (cb) => requestIdleCallback(cb, { timeout: 5000 })
      : (cb) => setTimeout(cb, 0);
  // A second's grace first, then wait while the first screen's own requests are in flight: its
  // data comes before spare code.
  const start = () => {
    if (busy()) setTimeout(start, 250);
    else whenIdle(() => void run());
  };
  setTimeout(start, 1000);
}

/**
 * Starts the preload once a screen is up: the screen frames (sign-in and the other account
 * screens, the lab shell, the lab list) call this, so it never competes with the first screen.
 */
export function usePreloadOnceShown(): void {
  const client = useQueryClient();
  useEffect(() => preloadWhenIdle(() => client.isFetching() > 0), [client]);
}
