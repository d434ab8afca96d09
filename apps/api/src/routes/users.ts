import { Router } from 'express';
import { allow, principal } from '../middleware/auth';
import type { Role } from '../models';
import { createUser, listUsers, updateUser } from '../services/users';
import { idParam, str } from './params';

export const userRoutes = Router();
const admin = allow('admin');

userRoutes.get('/users', admin, async (_req, res) => {
  res.json(await listUsers());
});

userRoutes.post('/users', admin, async (req, res) => {
  const user = await createUser(principal(req), {
    email: str(req.body, 'email'),
    name: str(req.body, 'name'),
    role: str(req.body, 'role') as Role,
    password: str(req.body, 'password', true) || undefined,
  });
  res.status(201).json(user);
});

/** Any of { name, role, active }; see updateUser for what disabling does. */
userRoutes.patch('/users/:id', admin, async (req, res) => {
  res.json(await updateUser(principal(req), idParam(req.params.id), req.body));
});
