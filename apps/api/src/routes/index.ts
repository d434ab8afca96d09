/**
 * The routers of /api/v1, one resource a file. `publicRoutes` answer before authentication
 * (signing in); every router of `authenticatedRoutes` runs after it and checks roles itself.
 */
import type { Router } from 'express';
import { auditRoutes } from './audit';
import { authRoutes } from './auth';
import { batchRoutes } from './batches';
import { eventRoutes } from './events';
import { exportRoutes } from './exports';
import { healthRoutes } from './health';
import { mailRoutes } from './mail';
import { metricsRoutes } from './metrics';
import { passwordResetRoutes } from './password-resets';
import { projectRoutes } from './projects';
import { reportRoutes } from './reports';
import { reviewRequestRoutes } from './review-requests';
import { reviewRoutes } from './reviews';
import { runRoutes } from './runs';
import { sectionRoutes } from './sections';
import { studyRoutes } from './studies';
import { terrainRoutes } from './terrain';
import { tokenRoutes } from './tokens';
import { userRoutes } from './users';

export const publicRoutes: readonly Router[] = [authRoutes, passwordResetRoutes];

/** Routes at the root, outside /api/v1 and without a token: health, readiness, metrics. */
export const rootRoutes: readonly Router[] = [healthRoutes, metricsRoutes];

export const authenticatedRoutes: readonly Router[] = [
  userRoutes,
  tokenRoutes,
  auditRoutes,
  mailRoutes,
  projectRoutes,
  batchRoutes,
  terrainRoutes,
  eventRoutes,
  sectionRoutes,
  runRoutes,
  reviewRoutes,
  reviewRequestRoutes,
  exportRoutes,
  reportRoutes,
  studyRoutes,
];
