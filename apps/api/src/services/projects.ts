/** Projects: every user sees every project; an integration token only those it is granted. */
import { Op } from 'sequelize';
import { sequelize } from '../db';
import { notFound } from '../errors';
import { Project } from '../models';
import { audit } from './audit';
import { assertProject, type Principal } from './auth';

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

/** A new project and its audit entry, in one transaction: never one without the other. */
export async function createProject(p: Principal, body: { name: string; description?: string }) {
  const project = await sequelize.transaction(async (transaction) => {
    const row = await Project.create(
      { name: body.name, description: body.description ?? null, createdBy: p.userId },
      { transaction },
    );
    await audit(p.userId, 'create', 'project', row.id, { name: body.name }, transaction);
    return row;
  });
  return projectView(project);
}
