/**
 * Serves the built single-page app: static files, then `index.html` for every other non-API GET so
 * the client router can take the path. Files under `assets/` are named by a hash of their content
 * (Vite), so a new build brings new names: browsers keep them for a year without asking again,
 * while `index.html`, which names them, is checked on every load.
 */
import { existsSync } from 'node:fs';
import path from 'node:path';
import express, { type Router } from 'express';
import { sendFailure } from './errorHandler';

const HASHED_FOR_A_YEAR = 'public, max-age=31536000, immutable';

export function clientFiles(clientDir: string): Router {
  const root = path.resolve(clientDir);
  const indexFile = path.join(root, 'index.html');
  const hashedDir = path.join(root, 'assets') + path.sep;
  const router = express.Router();
  router.use(
    express.static(root, {
      index: false,
      maxAge: '1h',
      setHeaders: (res, filePath) => {
        if (filePath.startsWith(hashedDir)) res.setHeader('Cache-Control', HASHED_FOR_A_YEAR);
      },
    }),
  );
  router.get('/{*splat}', (req, res, next) => {
    if (req.path === '/api' || req.path.startsWith('/api/')) {
      next();
      return;
    }
    if (!existsSync(indexFile)) {
      sendFailure(res, { code: 'not_found', message: `The client is not built (${indexFile} is missing); run npm run build` });
      return;
    }
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(indexFile);
  });
  return router;
}
