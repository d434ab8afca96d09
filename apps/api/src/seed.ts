/**
 * Demo data: users of every role and the invented Wendlecombe corridor: its sections, the same
 * sections with uncertain strengths (each station's probability of failure), and the natural
 * ground along its line cut from its terrain model (examples/terrain). Idempotent batch by
 * batch: a demo batch is submitted when its project has no batch of its name, so a database
 * seeded before a demo batch was added gets that batch at the next start.
 */
import fs from 'node:fs';
import path from 'node:path';
import { jobFiles, readTerrainJob } from '@scarpline/terrain';
import { DEMO_USERS } from './demo-users';
import { Batch, Project, User } from './models';
import { submitBatch } from './services/batches';
import { submitTerrainBatch } from './services/terrain';
import { inputContentType } from './services/files';
import { createUser } from './services/users';
import { parseFiles } from './services/validate';

export { DEMO_USERS };

const PROJECT = 'Wendlecombe bypass';

/** The demo inputs: corridor batch files, and a terrain job (its files beside it). */
export interface DemoInputs {
  corridors: string[];
  terrainJob?: string;
}

/** Seeds what is missing; says which demo batches it submitted (by name). */
export async function seedDemo({ corridors, terrainJob }: DemoInputs): Promise<{
  submitted: string[];
}> {
  for (const u of DEMO_USERS) {
    if (!(await User.findOne({ where: { email: u.email } }))) await createUser(null, u);
  }
  const engineer = await User.findOne({ where: { email: DEMO_USERS[1].email } });
  if (!engineer) throw new Error('demo engineer missing');
  const [project] = await Project.findOrCreate({
    where: { name: PROJECT },
    defaults: {
      name: PROJECT,
      description: 'Invented demonstration corridor (not for design).',
      createdBy: engineer.id,
    },
  });
  const present = async (name: string) =>
    (await Batch.count({ where: { projectId: project.id, name } })) > 0;
  // The seed acts as the demo engineer.
  const principal = {
    userId: engineer.id,
    email: engineer.email,
    name: engineer.name,
    role: engineer.role,
    tokenId: 0,
    projectIds: null,
  };
  const submitted: string[] = [];
  for (const file of corridors) {
    const text = fs.readFileSync(file, 'utf8');
    const name = path.basename(file);
    const parsed = parseFiles([{ name, text }]);
    if (await present(parsed.name)) continue;
    const input = { name, contentType: inputContentType(name), body: Buffer.from(text, 'utf8') };
    await submitBatch(principal, project.id, parsed, 'seed', [input]);
    submitted.push(parsed.name);
  }
  if (terrainJob) {
    const job = { name: path.basename(terrainJob), text: fs.readFileSync(terrainJob, 'utf8') };
    const read = readTerrainJob(job.text, job.name);
    // the batch's name is the corridor settings' id (a template given inline, as the demo's is)
    const name = typeof read.template === 'string' ? null : read.template.id;
    if (name === null || !(await present(name))) {
      // the files the job names, beside it
      const dir = path.dirname(terrainJob);
      const files = jobFiles(read).map((n) => ({
        name: path.basename(n),
        body: fs.readFileSync(path.join(dir, n)),
      }));
      const batch = await submitTerrainBatch(principal, project.id, job, files);
      submitted.push(name ?? batch.name);
    }
  }
  return { submitted };
}
