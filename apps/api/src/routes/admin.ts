import { Router } from 'express';
import { config } from '../config';
import { notFound } from '../errors';
import { allow, principal } from '../middleware/auth';
import { AuditEntry, type Role } from '../models';
import { createIntegrationToken, listIntegrationTokens, revokeToken } from '../services/auth';
import { fakeInbox } from '../services/mail';
import { createUser, listUsers, updateUser } from '../services/users';
import { idParam, str } from './params';

export const adminRoutes = Router();
const admin = allow('admin');

adminRoutes.get('/users', admin, async (_req, res) => {
  res.json(await listUsers());
});

adminRoutes.post('/users', admin, async (req, res) => {
  const user = await createUser(principal(req), {
    email: str(req.body, 'email'),
    name: str(req.body, 'name'),
    role: str(req.body, 'role') as Role,
    password: str(req.body, 'password', true) || undefined,
  });
  res.status(201).json(user);
});

/** Any of { name, role, active }; see updateUser for what disabling does. */
adminRoutes.patch('/users/:id', admin, async (req, res) => {
  res.json(await updateUser(principal(req), idParam(req.params.id), req.body));
});

adminRoutes.get('/tokens', admin, async (_req, res) => {
  res.json(await listIntegrationTokens());
});

adminRoutes.post('/tokens', admin, async (req, res) => {
  const body = req.body as { projectIds?: unknown; days?: unknown };
  const projectIds = Array.isArray(body.projectIds)
    ? body.projectIds.map((v) => idParam(v, 'projectIds[]'))
    : [];
  const created = await createIntegrationToken(principal(req), {
    userId: idParam((req.body as { userId?: unknown }).userId, 'userId'),
    name: str(req.body, 'name'),
    projectIds,
    days: typeof body.days === 'number' ? body.days : undefined,
  });
  res.status(201).json(created);
});

adminRoutes.delete('/tokens/:id', admin, async (req, res) => {
  res.json(await revokeToken(principal(req), idParam(req.params.id)));
});

adminRoutes.get('/audit', admin, async (_req, res) => {
  const rows = await AuditEntry.findAll({ order: [['id', 'DESC']], limit: 200 });
  res.json(rows.map((r) => r.toJSON()));
});

/** The local SMTP fake's messages (development and tests only). */
adminRoutes.get('/mail', admin, (_req, _res, next) => {
  if (config.smtpUrl) return next(notFound('mailbox'));
  _res.json(fakeInbox());
});
