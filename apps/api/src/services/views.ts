/** Small pieces shared by the views of several resources: station labels and users. */
import { Op } from 'sequelize';
import { chainageLabel } from '@scarpline/core/draw';
import type { Section } from '@scarpline/core/model';
import { User, type SectionRow } from '../models';

/** A station as chainage in the units of the section's file ("1+240"); null without one. */
export function stationLabel(s: SectionRow): string | null {
  return s.station === null ? null : chainageLabel(s.station, (s.input as Section).units ?? 'si');
}

/** A user as every role may see them beside what they did: id and name, never the e-mail. */
export interface UserRef {
  id: number;
  name: string;
}

/** The users of these ids that are on record (users are deactivated, never deleted). */
export async function userRefs(ids: readonly (number | null)[]): Promise<Map<number, UserRef>> {
  const wanted = [...new Set(ids.filter((id): id is number => id !== null))];
  const users = wanted.length
    ? await User.findAll({ where: { id: { [Op.in]: wanted } }, attributes: ['id', 'name'] })
    : [];
  return new Map(users.map((u) => [u.id, { id: u.id, name: u.name }]));
}

/** One user that must be on record (a batch's submitter: the foreign key keeps them). */
export async function userRef(id: number): Promise<UserRef> {
  const found = (await userRefs([id])).get(id);
  if (!found) throw new Error(`user ${id} is not on record`);
  return found;
}

/** A user as the users' admin and the user themselves see them. */
export function publicUser(u: User) {
  return {
    id: u.id,
    email: u.email,
    name: u.name,
    role: u.role,
    active: u.active,
    mustChangePassword: u.mustChangePassword ?? false,
  };
}
