/**
 * The local stand-in for S3-compatible object storage in development and tests (the `s3rver`
 * package) on 127.0.0.1, data under S3_DIR. Production points S3_ENDPOINT at a real service.
 *
 *   node --import tsx scripts/s3-standin.ts     (S3_PORT, default 4568; S3_DIR; S3_BUCKET)
 */
import { mkdirSync } from 'node:fs';
import S3rver from 's3rver';

const port = Number(process.env.S3_PORT ?? 4568);
const directory = process.env.S3_DIR ?? '.data/s3';
const bucket = process.env.S3_BUCKET ?? 'chromaslate';
mkdirSync(directory, { recursive: true });

// The browser PUTs straight to the presigned URL, so the bucket must allow the app's origin.
const cors = `<CORSConfiguration><CORSRule><AllowedOrigin>*</AllowedOrigin><AllowedMethod>GET</AllowedMethod><AllowedMethod>PUT</AllowedMethod><AllowedMethod>HEAD</AllowedMethod><AllowedHeader>*</AllowedHeader><ExposeHeader>ETag</ExposeHeader><MaxAgeSeconds>3000</MaxAgeSeconds></CORSRule></CORSConfiguration>`;

const server = new S3rver({
	address: '127.0.0.1',
	port,
	silent: true,
	directory,
	configureBuckets: [{ name: bucket, configs: [cors] }]
});

await server.run();
console.log(`[s3-standin] listening on 127.0.0.1:${port}, bucket "${bucket}", data in ${directory}`);
const stop = () => {
	void server.close().then(() => process.exit(0));
};
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
