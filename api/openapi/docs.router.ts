import { createRequire } from 'node:module';
import path from 'node:path';
import express, { Router } from 'express';

const require = createRequire(import.meta.url);
const swaggerUiDir = path.dirname(require.resolve('swagger-ui-dist/package.json'));

const page = `<!doctype html>
<html lang="en">
<head>
  <meta charset="utf-8">
  <title>Quietbridge API</title>
  <link rel="stylesheet" href="/api/docs/assets/swagger-ui.css">
</head>
<body>
  <div id="api-docs"></div>
  <script src="/api/docs/assets/swagger-ui-bundle.js"></script>
  <script src="/api/docs/start.js"></script>
</body>
</html>
`;

// Kept out of the page so the Content-Security-Policy needs no inline script.
const startScript = `window.addEventListener('load', function () {
  window.SwaggerUIBundle({ url: '/api/openapi.json', dom_id: '#api-docs', deepLinking: true, tryItOutEnabled: false });
});
`;

/** The interactive API reference at /api/docs, served from the bundled swagger-ui-dist package. */
export function docsRouter(document: () => unknown): Router {
  const router = Router();
  router.get('/openapi.json', (_req, res) => {
    res.json(document());
  });
  router.use('/docs/assets', express.static(swaggerUiDir, { index: false, maxAge: '1h' }));
  router.get('/docs/start.js', (_req, res) => {
    res.type('application/javascript').send(startScript);
  });
  router.get(['/docs', '/docs/'], (_req, res) => {
    res.type('html').send(page);
  });
  return router;
}
