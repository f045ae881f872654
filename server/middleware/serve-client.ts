import { existsSync } from 'node:fs';
import path from 'node:path';
import express, { type Express } from 'express';
import { HttpStatus } from '../http-status';

/** Serves the built client from `distDir`; any other GET that is not an
 * API call and does not name a file gets index.html (client-side routing). */
export function serveClient(app: Express, distDir: string): void {
  const indexHtml = path.join(distDir, 'index.html');
  app.use(
    express.static(distDir, {
      index: false,
      dotfiles: 'ignore',
      setHeaders(res, filePath) {
        // Vite puts a content hash in every file name under assets/.
        if (filePath.startsWith(path.join(distDir, 'assets') + path.sep)) {
          res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
        }
      },
    }),
  );
  app.use((req, res, next) => {
    if (req.method !== 'GET' && req.method !== 'HEAD') return next();
    if (req.path.startsWith('/api/') || req.path === '/api') return next();
    if (path.extname(req.path) !== '') {
      res.status(HttpStatus.NOT_FOUND).type('text/plain').send('Not found.');
      return;
    }
    if (!existsSync(indexHtml)) {
      res.status(HttpStatus.SERVICE_UNAVAILABLE).type('text/plain').send('The Paraxia client has not been built yet: run `npx vite build` (npm start does it for you).');
      return;
    }
    res.setHeader('Cache-Control', 'no-cache');
    // The dist folder may itself sit under a dot-folder (e.g. a test's .data/).
    res.sendFile(indexHtml, { dotfiles: 'allow' });
  });
}
