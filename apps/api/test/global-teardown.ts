/** The cluster keeps running (it is shared with development); `node apps/api/scripts/pg.js stop` ends it. */
export default async function globalTeardown(): Promise<void> {}
