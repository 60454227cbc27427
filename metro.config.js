// Metro for `npm run dev`: the Expo web dev server forwards /api to the API server, so the
// app talks to one origin in development just as it does in production.
const http = require('node:http');
const { getDefaultConfig } = require('expo/metro-config');

const config = getDefaultConfig(__dirname);
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
