// The client's one reader of build-time settings. Empty means "same origin as the page",
// which is how the one-server product and the dev proxy are set up.
export const apiBaseUrl: string = process.env.EXPO_PUBLIC_API_URL ?? '';
