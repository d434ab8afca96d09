/**
 * Demo data: users of every role and the invented Wendlecombe corridor: its sections, and the
 * natural ground along its line cut from its terrain model (examples/terrain). Idempotent.
 */
import fs from 'node:fs';
import path from 'node:path';
import { jobFiles, readTerrainJob } from '@scarpline/terrain';
import { DEMO_USERS } from './demo-users';
import { Project, User } from './models';
import { submitBatch } from './services/batches';
import { submitTerrainBatch } from './services/terrain';
import { inputContentType } from './services/files';
import { createUser } from './services/users';
import { parseFiles } from './services/validate';

export { DEMO_USERS };

export async function seedDemo(
  corridorFile: string,
  terrainJob?: string,
): Promise<{ created: boolean }> {
  for (const u of DEMO_USERS) {
    if (!(await User.findOne({ where: { email: u.email } }))) await createUser(null, u);
  }
  if (await Project.findOne({ where: { name: 'Wendlecombe bypass' } })) return { created: false };
  const engineer = await User.findOne({ where: { email: DEMO_USERS[1].email } });
  if (!engineer) throw new Error('demo engineer missing');
  const project = await Project.create({
    name: 'Wendlecombe bypass',
    description: 'Invented demonstration corridor (not for design).',
    createdBy: engineer.id,
  });
  const text = fs.readFileSync(corridorFile, 'utf8');
  const parsed = parseFiles([{ name: path.basename(corridorFile), text }]);
  // The seed acts as the demo engineer.
  const principal = {
    userId: engineer.id,
    email: engineer.email,
    name: engineer.name,
    role: engineer.role,
    tokenId: 0,
    projectIds: null,
  };
  const name = path.basename(corridorFile);
  const input = { name, contentType: inputContentType(name), body: Buffer.from(text, 'utf8') };
  await submitBatch(principal, project.id, parsed, 'seed', [input]);
  if (terrainJob) {
    // the files the job names, beside it
    const dir = path.dirname(terrainJob);
    const job = { name: path.basename(terrainJob), text: fs.readFileSync(terrainJob, 'utf8') };
    const files = jobFiles(readTerrainJob(job.text, job.name)).map((n) => ({
      name: path.basename(n),
      body: fs.readFileSync(path.join(dir, n)),
    }));
    await submitTerrainBatch(principal, project.id, job, files);
  }
  return { created: true };
}
