/**
 * The local stand-in for object storage: an s3rver on loopback, for `npm start` and `npm test`
 * (scripts/lib.sh starts it with `s3_up` and stops it by pid with `s3_down`).
 *
 *   node --import tsx scripts/s3-server.ts <port> <data directory> <bucket> [pid file]
 *
 * The pid file is written once it listens, so the caller knows both that it is up and which
 * process to stop.
 * The bucket is created at start. The credentials it accepts are s3rver's fixed pair,
 * `S3RVER` / `S3RVER`, which are also the server's development defaults (server/config.ts).
 */
import fs from 'node:fs';
import S3rver from 's3rver';

async function main() {
  const [portText, directory, bucket, pidFile] = process.argv.slice(2);
  const port = Number(portText);
  if (!Number.isInteger(port) || port < 1 || port > 65535 || !directory || !bucket) {
    throw new Error('usage: s3-server.ts <port> <data directory> <bucket> [pid file]');
  }
  fs.mkdirSync(directory, { recursive: true });
  const server = new S3rver({
    address: '127.0.0.1',
    port,
    directory,
    silent: true,
    configureBuckets: [{ name: bucket, configs: [] }],
  });
  const address = await server.run();
  if (pidFile) fs.writeFileSync(pidFile, `${process.pid}\n`);
  process.stdout.write(`s3rver on http://${address.address}:${address.port}, bucket ${bucket}, data in ${directory}\n`);

  const stop = async () => {
    await server.close();
    if (pidFile) fs.rmSync(pidFile, { force: true });
    process.exit(0);
  };
  process.on('SIGTERM', stop);
  process.on('SIGINT', stop);
}

main().catch((error: unknown) => {
  process.stderr.write(`s3-server: ${error instanceof Error ? error.message : String(error)}\n`);
  process.exit(1);
});
