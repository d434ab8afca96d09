#!/usr/bin/env node
/**
 * The local S3 fake for development and tests (the s3rver package), in place of real object
 * storage:
 *
 *   node apps/api/scripts/s3.js serve           # runs it until Ctrl-C (npm start supervises this)
 *   node apps/api/scripts/s3.js run <command…>  # starts it when nothing answers on its port, runs
 *                                               # the command, then stops it if this started it
 *
 * It listens on 127.0.0.1 only, on a port of its own checkout: SCARPLINE_S3_PORT when set, else
 * one derived from its data folder (57000 to 58999), so that two checkouts do not meet. Its
 * objects live in apps/api/.data/s3 (git-ignored), or SCARPLINE_S3_DIR. At start it makes the
 * buckets the API uses in development and in the tests (BUCKETS). It accepts the credentials
 * S3RVER / S3RVER (FAKE_CREDENTIALS), which config.ts gives the API when no endpoint is set.
 * Production never uses it: there AWS_ENDPOINT_URL_S3 (or AWS's own endpoints) is real storage.
 */
const fs = require('node:fs');
const net = require('node:net');
const path = require('node:path');
const ports = require('./local-ports');

const API_DIR = path.resolve(__dirname, '..');
/** The development bucket and the tests' bucket (config.ts picks one by NODE_ENV). */
const BUCKETS = ['scarpline', 'scarpline-test'];
const FAKE_CREDENTIALS = { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' };
const PORT_BASE = 57000;
const PORT_SPAN = 2000;

function log(message) {
  process.stderr.write(`s3: ${message}\n`);
}

function dataDir() {
  return process.env.SCARPLINE_S3_DIR || path.join(API_DIR, '.data', 's3');
}

/** SCARPLINE_S3_PORT, else the port derived from the data folder. */
function portOf() {
  return (
    ports.portFromEnvironment('SCARPLINE_S3_PORT') ??
    ports.derivedPort(dataDir(), PORT_BASE, PORT_SPAN)
  );
}

/** The fake's address, as AWS_ENDPOINT_URL_S3 would give it. */
function endpoint() {
  return `http://127.0.0.1:${portOf()}`;
}

/** Whether something accepts connections on 127.0.0.1:port. */
function answers(port) {
  return new Promise((resolve) => {
    const socket = net.connect({ port, host: '127.0.0.1' });
    socket.setTimeout(1000);
    socket.once('connect', () => {
      socket.destroy();
      resolve(true);
    });
    socket.once('timeout', () => {
      socket.destroy();
      resolve(false);
    });
    socket.once('error', () => resolve(false));
  });
}

/** Makes the buckets on a fake that already runs (another `npm start` or test run started it). */
async function ensureBuckets() {
  const { S3Client, CreateBucketCommand } = require('@aws-sdk/client-s3');
  const client = new S3Client({
    endpoint: endpoint(),
    region: 'us-east-1',
    forcePathStyle: true,
    credentials: FAKE_CREDENTIALS,
    maxAttempts: 1,
  });
  try {
    for (const Bucket of BUCKETS) {
      try {
        await client.send(new CreateBucketCommand({ Bucket }));
      } catch (e) {
        if (e.name !== 'BucketAlreadyOwnedByYou' && e.name !== 'BucketAlreadyExists') throw e;
      }
    }
  } catch (e) {
    throw new Error(
      `127.0.0.1:${portOf()} answers but is not the S3 fake (${e.message}): set SCARPLINE_S3_PORT to a free port`,
    );
  } finally {
    client.destroy();
  }
}

/**
 * Starts the fake in this process unless one already answers on its port (or AWS_ENDPOINT_URL_S3
 * names other storage); resolves with its endpoint and `stop()` (which stops it only if this
 * call started it).
 */
async function start() {
  if (process.env.AWS_ENDPOINT_URL_S3) {
    return { endpoint: process.env.AWS_ENDPOINT_URL_S3, started: false, stop: async () => {} };
  }
  const port = portOf();
  if (await answers(port)) {
    await ensureBuckets();
    return { endpoint: endpoint(), started: false, stop: async () => {} };
  }
  const S3rver = require('s3rver');
  const directory = dataDir();
  fs.mkdirSync(directory, { recursive: true });
  const server = new S3rver({
    address: '127.0.0.1',
    port,
    silent: true,
    directory,
    configureBuckets: BUCKETS.map((name) => ({ name })),
  });
  try {
    await server.run();
  } catch (e) {
    throw new Error(
      `the S3 fake could not listen on 127.0.0.1:${port} (${e.message}): set SCARPLINE_S3_PORT to a free port`,
    );
  }
  log(`fake listening on ${endpoint()} (${directory})`);
  return { endpoint: endpoint(), started: true, stop: () => server.close() };
}

/** Runs a command with the fake answering (see the header); resolves with its exit code. */
async function run(command, args) {
  const fake = await start();
  const { spawn } = require('node:child_process');
  const child = spawn(command, args, { stdio: 'inherit' });
  const ignore = () => {};
  process.on('SIGINT', ignore);
  process.on('SIGTERM', ignore);
  const code = await new Promise((resolve) => {
    child.once('error', (e) => {
      log(`could not run ${command}: ${e.message}`);
      resolve(127);
    });
    child.once('exit', (c, signal) => resolve(c ?? (signal ? 128 : 0)));
  });
  process.off('SIGINT', ignore);
  process.off('SIGTERM', ignore);
  await fake.stop();
  return code;
}

module.exports = {
  start,
  run,
  answers,
  endpoint,
  portOf,
  derivedPort: (dir) => ports.derivedPort(dir, PORT_BASE, PORT_SPAN),
  dataDir,
  BUCKETS,
  FAKE_CREDENTIALS,
};

if (require.main === module) {
  const command = process.argv[2];
  (async () => {
    if (command === 'serve') {
      const fake = await start();
      if (!fake.started) {
        log(`a fake already answers on ${fake.endpoint}: using that one`);
        // Stay up, so that a supervisor does not start this again and again.
        setInterval(() => {}, 1 << 30);
      }
      const stop = () => fake.stop().then(() => process.exit(0));
      process.once('SIGINT', stop);
      process.once('SIGTERM', stop);
    } else if (command === 'run' && process.argv.length > 3) {
      const [cmd, ...args] = process.argv.slice(3).filter((a, i) => i > 0 || a !== '--');
      process.exitCode = await run(cmd, args);
    } else {
      console.error('usage: s3.js serve | run <command…>');
      process.exitCode = 64;
    }
  })().catch((e) => {
    console.error(`s3: ${e.message}`);
    process.exitCode = 1;
  });
}
