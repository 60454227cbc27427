// Metro for `npm run dev`: the Expo web dev server forwards /api to the API server, so the
// app talks to one origin in development just as it does in production.
const http = require('node:http');
const path = require('node:path');
const { getDefaultConfig } = require('expo/metro-config');

const config = getDefaultConfig(__dirname);

// zod re-exports every one of its ~50 locales (about 270 KB minified) and Metro does not
// drop unused exports, so they would all load with the first page. The app speaks English:
// zod's locales index resolves to a module with English alone.
const zodLocales = path.join(__dirname, 'metro-zod-locales.js');
// Likewise simple-statistics: the web bundle takes the few functions the app uses, one module each.
const simpleStatistics = path.join(__dirname, 'metro-simple-statistics.js');
const resolveRequest = config.resolver.resolveRequest;
config.resolver.resolveRequest = (context, moduleName, platform) => {
  if (moduleName === 'simple-statistics') {
    return { type: 'sourceFile', filePath: simpleStatistics };
  }
  if (
    moduleName === '../locales/index.js' &&
    /[\\/]node_modules[\\/]zod[\\/]/.test(context.originModulePath)
  ) {
    return { type: 'sourceFile', filePath: zodLocales };
  }
  return (resolveRequest ?? context.resolveRequest)(context, moduleName, platform);
};
const apiUrl = process.env.QB_DEV_API_URL;

if (apiUrl) {
  const target = new URL(apiUrl);
  config.server = {
    ...config.server,
    enhanceMiddleware: (metroMiddleware) => (req, res, next) => {
      if (!req.url || !req.url.startsWith('/api/')) return metroMiddleware(req, res, next);
      const upstream = http.request(
        {
          host: target.hostname,
          port: target.port,
          path: req.url,
          method: req.method,
          headers: req.headers,
        },
        (answer) => {
          res.writeHead(answer.statusCode ?? 502, answer.headers);
          answer.pipe(res);
        },
      );
      upstream.on('error', () => {
        res.writeHead(502, { 'Content-Type': 'application/json' });
        res.end(
          JSON.stringify({
            error: { code: 'unavailable', message: 'The API server is not running.' },
          }),
        );
      });
      req.pipe(upstream);
    },
  };
}

module.exports = config;
