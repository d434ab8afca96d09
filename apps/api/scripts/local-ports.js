/**
 * Ports of the local servers of one checkout (the PostgreSQL cluster in pg.js, the S3 fake in
 * s3.js): each derived from the server's data folder, so the same checkout gets the same port
 * every time and two checkouts on one machine do not meet; or the one an environment variable
 * names.
 */
const crypto = require('node:crypto');
const path = require('node:path');

/** base + (hash of the folder mod span): the same for a folder every time, another for another. */
function derivedPort(dir, base, span) {
  const hash = crypto.createHash('sha256').update(path.resolve(dir)).digest();
  return base + (hash.readUInt32BE(0) % span);
}

/** The port written in the environment variable `name`, or null; a value that is no port is an error. */
function portFromEnvironment(name) {
  const raw = process.env[name];
  if (!raw) return null;
  const port = Number(raw);
  if (!Number.isInteger(port) || port < 1 || port > 65535) {
    throw new Error(`${name}=${raw} is not a port: give a number from 1024 to 65535`);
  }
  return port;
}

module.exports = { derivedPort, portFromEnvironment };
