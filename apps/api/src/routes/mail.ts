import { Router } from 'express';
import { config } from '../config';
import { notFound } from '../errors';
import { allow } from '../middleware/auth';
import { fakeInbox } from '../services/mail';

export const mailRoutes = Router();

/** The local SMTP fake's messages (development and tests only). */
mailRoutes.get('/mail', allow('admin'), (_req, res, next) => {
  if (config.smtpUrl) return next(notFound('mailbox'));
  res.json(fakeInbox());
});
