/** Test helpers: users of every role, sign-in, polling for a batch with a bounded wait. */
import request from 'supertest';
import type { Express } from 'express';
import { ROLES, type Role } from '../src/models';
import { createUser } from '../src/services/users';

export const PASSWORD = 'test-password-1';

/** One user per role, e-mails prefixed so parallel test files never collide. */
export async function makeUsers(
  prefix: string,
): Promise<Record<Role, { id: number; email: string }>> {
  const out = {} as Record<Role, { id: number; email: string }>;
  for (const role of ROLES) {
    const u = await createUser(null, {
      email: `${prefix}-${role}@test.scarpline.example`,
      name: `${prefix} ${role}`,
      role,
      password: role === 'integration' ? undefined : PASSWORD,
    });
    out[role] = { id: u.id, email: u.email };
  }
  return out;
}

export async function signIn(app: Express, email: string): Promise<string> {
  const res = await request(app).post('/api/v1/auth/login').send({ email, password: PASSWORD });
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
