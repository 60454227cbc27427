import { usePathname } from 'expo-router';

// Read when the bundle loads, before the router touches the address bar. While a layout
// shows its loading state its nested routes are not mounted, so the router knows only the
// layout's path and writes that back to the address bar: the deep link would be lost.
const opened = `${window.location.pathname}${window.location.search}`;

/** The path the user asked for, to come back to after signing in. */
export function useRequestedPath(): string {
  const pathname = usePathname();
  return opened.startsWith(`${pathname}/`) ? opened : pathname;
}
