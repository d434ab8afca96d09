import fs from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { createApp } from '../src/app';
import { sequelize } from '../src/db';
import { authenticatedRoutes, publicRoutes, rootRoutes } from '../src/routes';

const doc = JSON.parse(
  fs.readFileSync(path.resolve(__dirname, '../../../schemas/openapi.json'), 'utf8'),
);
const app = createApp();

afterAll(async () => {
  await sequelize.close();
});

interface Layer {
  route?: { path: string; methods: Record<string, boolean> };
}

/** Every method and path the routers register, in OpenAPI's {param} form. */
function registered(routers = [...rootRoutes, ...publicRoutes, ...authenticatedRoutes]): string[] {
  const out: string[] = [];
  for (const r of routers) {
    for (const layer of r.stack as Layer[]) {
      if (!layer.route) continue;
      const p = layer.route.path.replace(/:(\w+)/g, '{$1}');
      for (const m of Object.keys(layer.route.methods)) out.push(`${m} ${p}`);
    }
  }
  return out.sort();
}

const documented = () =>
  Object.entries(doc.paths as Record<string, Record<string, unknown>>)
    .flatMap(([p, ops]) => Object.keys(ops).map((m) => `${m} ${p}`))
    .sort();

test('every route the app registers is in the OpenAPI document, and nothing else', () => {
  const routes = registered();
  expect(routes.length).toBeGreaterThan(20);
  expect(documented()).toEqual(routes);
});

test('the routes at the root (health, readiness, metrics) are documented at the root, without a token', () => {
  const atRoot = Object.entries(doc.paths as Record<string, Record<string, { servers?: unknown }>>)
    .flatMap(([p, ops]) =>
      Object.entries(ops)
        .filter(
          ([, op]) =>
            JSON.stringify(op.servers) ===
            JSON.stringify([
              { url: '/', description: 'At the root of the service, outside /api/v1' },
            ]),
        )
        .map(([m]) => `${m} ${p}`),
    )
    .sort();
  expect(atRoot).toEqual(registered([...rootRoutes]));
  expect(atRoot).toEqual(['get /health', 'get /metrics', 'get /ready']);
  expect(doc.paths['/health'].get.security).toEqual([]);
  expect(doc.paths['/ready'].get.security).toEqual([]);
});

test('the document is OpenAPI 3.1 and its roles match what the routes enforce', () => {
  expect(doc.openapi).toBe('3.1.0');
  expect(doc.paths['/sections/{id}/reviews'].post['x-roles']).toEqual(['admin', 'reviewer']);
  expect(
    doc.paths['/projects/{id}/batches'].post.requestBody.content['application/json'].schema,
  ).toEqual({ $ref: './batch.schema.json' });
});

test('served at /api/docs (swagger-ui) with the document and its schemas beside it', async () => {
  const ui = await request(app).get('/api/docs/');
  expect(ui.status).toBe(200);
  expect(ui.text).toContain('swagger-ui');
  const served = await request(app).get('/api/schemas/openapi.json');
  expect(served.status).toBe(200);
  expect(served.body).toEqual(doc);
  const batch = await request(app).get('/api/schemas/batch.schema.json');
  expect(batch.body.$id).toMatch(/batch\.schema\.json$/);
  expect((await request(app).get('/api/schemas/package.json')).status).toBe(404);
});
