/**
 * Serves the built single-page app: static files, then `index.html` for every other non-API GET so
 * the client router can take the path.
 */
import { existsSync } from 'node:fs';
import path from 'node:path';
import express, { type Router } from 'express';
import { sendFailure } from './errorHandler';

export function clientFiles(clientDir: string): Router {
  const root = path.resolve(clientDir);
  const indexFile = path.join(root, 'index.html');
  const router = express.Router();
  router.use(express.static(root, { index: false, maxAge: '1h' }));
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
