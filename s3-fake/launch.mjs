// Starts s3rver, the local stand-in for S3-compatible storage, with its objects
// in a folder of ours and the bucket Kinloop uses created if missing.
//   node s3-fake/launch.mjs --port 4568 --directory .data/s3 --bucket kinloop-rides
import { chmodSync, mkdirSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { parseArgs } from 'node:util';
import S3rver from 's3rver';

/** What an earlier version wrote world-readable becomes this user's alone: folders 0700, files 0600. */
function closeTree(dir) {
  chmodSync(dir, 0o700);
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, entry.name);
    if (entry.isDirectory()) closeTree(p);
    else if (entry.isFile() && statSync(p).mode & 0o077) chmodSync(p, 0o600);
  }
}

const { values } = parseArgs({
  options: {
    port: { type: 'string', default: '4568' },
    address: { type: 'string', default: '127.0.0.1' },
    directory: { type: 'string' },
    bucket: { type: 'string', default: 'kinloop-rides' },
  },
});
if (!values.directory) {
  console.error('usage: launch.mjs --directory DIR [--port N] [--bucket NAME]');
  process.exit(64);
}
// Ride files are health records: s3rver's folders and files are this user's alone (0700/0600).
process.umask(0o077);
mkdirSync(values.directory, { recursive: true, mode: 0o700 });
closeTree(values.directory);

const server = new S3rver({
  port: Number(values.port),
  address: values.address,
  directory: values.directory,
  silent: true,
  configureBuckets: [{ name: values.bucket }],
});
const { port, address } = await server.run();
console.log(`s3-fake ready on http://${address}:${port} bucket=${values.bucket}`);

const stop = () => server.close(() => process.exit(0));
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
