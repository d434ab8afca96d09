/**
 * The demo users `npm start` seeds (with the invented Wendlecombe corridor, seed.ts) and prints
 * for the person who started it (scripts/start.js reads this file's build: no database needed).
 */
import type { Role } from './models/user';

export const DEMO_USERS: { email: string; name: string; role: Role; password?: string }[] = [
  {
    email: 'admin@wendlecombe.example',
    name: 'Ada Admin',
    role: 'admin',
    password: 'demo-admin-2931',
  },
  {
    email: 'engineer@wendlecombe.example',
    name: 'Evan Engineer',
    role: 'engineer',
    password: 'demo-engineer-4417',
  },
  {
    email: 'reviewer@wendlecombe.example',
    name: 'Rhea Reviewer',
    role: 'reviewer',
    password: 'demo-reviewer-8062',
  },
  {
    email: 'viewer@wendlecombe.example',
    name: 'Vic Viewer',
    role: 'viewer',
    password: 'demo-viewer-5380',
  },
  { email: 'gis-feed@wendlecombe.example', name: 'GIS feed', role: 'integration' },
];
