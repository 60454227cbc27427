import { existsSync } from 'node:fs';
import path from 'node:path';
import express, { Router } from 'express';

/** Serves the exported web app with a fallback to index.html for client-side routes. */
export function webRouter(webDir: string): Router {
  const router = Router();
  const indexFile = path.join(webDir, 'index.html');
  router.use(
    express.static(webDir, {
      index: false,
      setHeaders: (res, file) => {
        if (file.endsWith('.wasm')) res.setHeader('Content-Type', 'application/wasm');
        // Hashed bundle names never change content; index.html must always be fresh.
        if (file.includes(`${path.sep}_expo${path.sep}`)) {
          res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
        }
      },
    }),
  );
  router.get('/{*splat}', (req, res) => {
    if (!existsSync(indexFile)) {
      res
        .status(503)
        .type('text/plain')
        .send('The web app has not been built yet. Run `npm run build:web`, then reload.');
      return;
    }
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(indexFile);
  });
  return router;
}
