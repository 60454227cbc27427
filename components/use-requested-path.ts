import { usePathname } from 'expo-router';

/** The path the user asked for, to come back to after signing in. */
export function useRequestedPath(): string {
  return usePathname();
}
