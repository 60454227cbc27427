/**
 * The Content-Security-Policy for the API and the exported web app: everything from our own
 * origin. What the app needs beyond that, each checked by the browser test
 * (tests/e2e/content-security-policy.test.ts):
 *
 * - script-src 'wasm-unsafe-eval': CanvasKit (the charts) compiles its WebAssembly; this does not
 *   allow eval() of JavaScript (the client runs zod without its eval-compiled parsers).
 * - style-src 'unsafe-inline': react-native-web and Skia's web loader write their styles into
 *   <style> elements at run time, and index.html carries Expo's style reset. A hash cannot cover
 *   rules made at run time, and a nonce needs a server-rendered page.
 * - img-src blob:: a photo chosen for upload is previewed from a blob: URL.
 */
export const contentSecurityPolicy: Record<string, string[] | null> = {
  defaultSrc: ["'self'"],
  baseUri: ["'none'"],
  scriptSrc: ["'self'", "'wasm-unsafe-eval'"],
  scriptSrcAttr: ["'none'"],
  styleSrc: ["'self'", "'unsafe-inline'"],
  imgSrc: ["'self'", 'blob:'],
  fontSrc: ["'self'"],
  connectSrc: ["'self'"],
  workerSrc: ["'none'"],
  frameSrc: ["'none'"],
  objectSrc: ["'none'"],
  formAction: ["'self'"],
  frameAncestors: ["'none'"],
  upgradeInsecureRequests: null,
};
