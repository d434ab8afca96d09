/**
 * Test helpers: users of every role, sign-in, polling for a batch with a bounded wait, and
 * checking a response against a schema of the OpenAPI document.
 */
import fs from 'node:fs';
import path from 'node:path';
import Ajv2020 from 'ajv/dist/2020';
import { exportTableSchema, resultSchema } from '@scarpline/schemas';
import request from 'supertest';
import type { Express } from 'express';
import { ROLES, User, type Role } from '../src/models';
import { hashPassword } from '../src/services/passwords';
import { createUser } from '../src/services/users';

export const PASSWORD = 'test-password-1';

let passwordHash: Promise<string> | null = null;

/**
 * One user per role, e-mails prefixed so parallel test files never collide. They share one
 * hash of PASSWORD, computed once per test file (a hash of the real cost takes a few hundred
 * milliseconds); the integration user is made by the service, as an admin makes one.
 */
export async function makeUsers(
  prefix: string,
): Promise<Record<Role, { id: number; email: string }>> {
  passwordHash ??= hashPassword(PASSWORD);
  const out = {} as Record<Role, { id: number; email: string }>;
  for (const role of ROLES) {
    const email = `${prefix}-${role}@test.scarpline.example`;
    const name = `${prefix} ${role}`;
    const u =
      role === 'integration'
        ? await createUser(null, { email, name, role })
        : await User.create({ email, name, role, passwordHash: await passwordHash });
    out[role] = { id: u.id, email: u.email };
  }
  return out;
}

export async function signIn(app: Express, email: string, password = PASSWORD): Promise<string> {
  const res = await request(app).post('/api/v1/auth/login').send({ email, password });
  if (res.status !== 200)
    throw new Error(`sign-in failed: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.token as string;
}

/** Polls until the batch is done; fails after `limitMs` (a bound, not an assertion on time). */
export async function waitForBatch(
  app: Express,
  token: string,
  batchId: number,
  limitMs = 45000,
): Promise<{ status: string; progress: Record<string, number> }> {
  const end = Date.now() + limitMs;
  for (;;) {
    const res = await request(app)
      .get(`/api/v1/batches/${batchId}`)
      .auth(token, { type: 'bearer' });
    if (res.body.status === 'done') return res.body;
    if (Date.now() > end) throw new Error(`batch ${batchId} not done: ${JSON.stringify(res.body)}`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

export function expectProblem(res: request.Response, status: number): void {
  expect(res.status).toBe(status);
  expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
  expect(res.body).toEqual(
    expect.objectContaining({ type: expect.any(String), title: expect.any(String), status }),
  );
  expect(JSON.stringify(res.body)).not.toMatch(/at .+\.(ts|js):\d+/);
}

const openapi = JSON.parse(
  fs.readFileSync(path.resolve(__dirname, '../../../schemas/openapi.json'), 'utf8'),
);
let ajv: Ajv2020 | null = null;

/** What does not conform to components/schemas/<name> of the OpenAPI document ([] if all does). */
export function schemaErrors(name: string, value: unknown): string[] {
  ajv ??= new Ajv2020({ strict: false, validateFormats: false, allErrors: true });
  if (!ajv.getSchema('openapi')) {
    // The document's relative references (./result.schema.json) resolve beside it, as served.
    ajv.addSchema(resultSchema);
    ajv.addSchema(exportTableSchema);
    ajv.addSchema({ ...openapi, $id: 'https://scarpline.example/schemas/openapi.json' }, 'openapi');
  }
  const validate = ajv.getSchema(`openapi#/components/schemas/${name}`);
  if (!validate) throw new Error(`the OpenAPI document has no schema ${name}`);
  return validate(value)
    ? []
    : (validate.errors ?? []).map((e) => `${name}${e.instancePath}: ${e.message}`);
}
