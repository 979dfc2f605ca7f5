import { existsSync } from 'node:fs';
import { join } from 'node:path';
import express, { type Express } from 'express';

/** The page served when the Angular build is missing. */
export const MISSING_CLIENT_PAGE = `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>Keelson</title></head>
<body><h1>Keelson</h1>
<p>The web client has not been built yet. Run <code>npm run build:web</code> and reload;
the API answers under <code>/api</code> meanwhile.</p></body></html>`;

/**
 * Serves the built Angular client from `webRoot` and answers every other GET (not under `/api`)
 * with its `index.html`, so deep links work. Without a build, a plain page says so (503).
 */
export function serveWebClient(app: Express, webRoot: string): void {
  const indexFile = join(webRoot, 'index.html');
  app.use(express.static(webRoot, { index: false, maxAge: '1h', fallthrough: true }));
  app.get('/{*splat}', (req, res, next) => {
    if (req.path === '/api' || req.path.startsWith('/api/')) {
      next();
      return;
    }
    if (!existsSync(indexFile)) {
      res.status(503).type('html').send(MISSING_CLIENT_PAGE);
      return;
    }
    // The shell must never be cached, or a new build would load old bundles.
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(indexFile);
  });
}
