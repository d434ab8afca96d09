/** Users (admins manage them) and projects. */
import { Op } from 'sequelize';
import { conflict, invalid, notFound } from '../errors';
import { Project, ROLES, User, type Role } from '../models';
import { audit } from './audit';
import { assertProject, publicUser, type Principal } from './auth';
import { hashPassword } from './passwords';

export async function listUsers() {
  return (await User.findAll({ order: [['id', 'ASC']] })).map(publicUser);
}

export async function createUser(
  admin: Principal | null,
  body: { email: string; name: string; role: Role; password?: string },
) {
  if (!ROLES.includes(body.role)) throw invalid(`role is one of ${ROLES.join(', ')}.`);
  if (body.role !== 'integration' && (!body.password || body.password.length < 8)) {
    throw invalid('password needs at least 8 characters.');
  }
  const email = body.email.trim().toLowerCase();
  if (await User.findOne({ where: { email } })) throw conflict(`${email} exists already.`);
  const user = await User.create({
    email,
    name: body.name,
    role: body.role,
    passwordHash:
      body.role === 'integration' || !body.password ? null : await hashPassword(body.password),
  });
  await audit(admin?.userId ?? null, 'create', 'user', user.id, { email, role: body.role });
  return publicUser(user);
}

export function projectView(p: Project) {
  return { id: p.id, name: p.name, description: p.description, createdAt: p.createdAt };
}

export async function listProjects(p: Principal) {
  const where = p.projectIds === null ? {} : { id: { [Op.in]: p.projectIds } };
  return (await Project.findAll({ where, order: [['id', 'ASC']] })).map(projectView);
}

export async function getProject(p: Principal, id: number) {
  assertProject(p, id);
  const project = await Project.findByPk(id);
  if (!project) throw notFound('project');
  return projectView(project);
}

export async function createProject(p: Principal, body: { name: string; description?: string }) {
  const project = await Project.create({
    name: body.name,
    description: body.description ?? null,
    createdBy: p.userId,
  });
  await audit(p.userId, 'create', 'project', project.id, { name: body.name });
  return projectView(project);
}
