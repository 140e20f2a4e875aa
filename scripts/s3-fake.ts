// A local S3-compatible service for development and tests (s3rver): listens on loopback at the
// port of S3_ENDPOINT, keeps its objects under S3_FAKE_DIR, creates S3_BUCKET at start, and accepts
// only the S3_ACCESS_KEY_ID / S3_SECRET_ACCESS_KEY pair. Takeproof talks to it through the AWS SDK,
// exactly as it would to a hosted service.
import { mkdir } from 'node:fs/promises';
import path from 'node:path';
import S3rver from 's3rver';
// s3rver checks request signatures against its own key registry; the configured pair replaces its built-in one.
import AWSAccount from 's3rver/lib/models/account.js';

const endpoint = new URL(process.env.S3_ENDPOINT || 'http://127.0.0.1:9400');
if (!['127.0.0.1', 'localhost', '[::1]'].includes(endpoint.hostname)) {
  console.error(`S3_ENDPOINT ${endpoint.origin} is not on this machine; the local stand-in only serves loopback addresses.`);
  process.exit(2);
}
const bucket = process.env.S3_BUCKET || 'takeproof';
const directory = path.resolve(process.env.S3_FAKE_DIR || 'var/s3');
const accessKeyId = process.env.S3_ACCESS_KEY_ID || 'takeproof-local';
const secretAccessKey = process.env.S3_SECRET_ACCESS_KEY || 'takeproof-local-secret';

AWSAccount.DUMMY_ACCOUNT.revokeAccessKey('S3RVER');
AWSAccount.DUMMY_ACCOUNT.createKeyPair(accessKeyId, secretAccessKey);

await mkdir(directory, { recursive: true });
const server = new S3rver({
  address: endpoint.hostname.replace(/^\[|\]$/g, ''),
  port: Number(endpoint.port || 80),
  directory,
  silent: true,
  configureBuckets: [{ name: bucket }],
});
await server.run();
console.log(`Local S3 service on ${endpoint.origin}, bucket ${bucket}, objects under ${path.relative(process.cwd(), directory) || '.'}`);

const stop = () => void server.close().then(() => process.exit(0));
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
