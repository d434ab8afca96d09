/**
 * Stops the S3 fake if the setup started it (a global the setup left). The cluster keeps
 * running (it is shared with development); `node apps/api/scripts/pg.js stop` ends it.
 */
export default async function globalTeardown(): Promise<void> {
  await (globalThis as { scarplineS3Stop?: () => Promise<void> }).scarplineS3Stop?.();
}
