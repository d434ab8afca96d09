import { Router } from 'express';
import { API_LIMITS } from '../limits';
import { allow, principal } from '../middleware/auth';
import type { Role } from '../models';
import { createUser, listUsers, updateUser } from '../services/users';
import { idParam, objectBody, str, text } from './params';

export const userRoutes = Router();
const admin = allow('admin');

userRoutes.get('/users', admin, async (_req, res) => {
  res.json(await listUsers());
});

userRoutes.post('/users', admin, async (req, res) => {
  const body = objectBody(req.body);
  const user = await createUser(principal(req), {
    email: text(body, 'email', API_LIMITS.email),
    name: text(body, 'name', API_LIMITS.name),
    role: text(body, 'role', 20) as Role,
    password: str(body, 'password', true, API_LIMITS.passwordMax) || undefined,
  });
  res.status(201).json(user);
});

/** Any of { name, role, active }; see updateUser for what disabling does. */
userRoutes.patch('/users/:id', admin, async (req, res) => {
  res.json(await updateUser(principal(req), idParam(req.params.id), req.body));
});
