// Starts s3rver, the local stand-in for S3-compatible storage, with its objects
// in a folder of ours and the bucket Kinloop uses created if missing.
//   node s3-fake/launch.mjs --port 4568 --directory .data/s3 --bucket kinloop-rides
import { chmodSync, mkdirSync } from 'node:fs';
import { parseArgs } from 'node:util';
import S3rver from 's3rver';

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
chmodSync(values.directory, 0o700);

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
