/**
 * Object storage (any S3-compatible service; the local stand-in in development and tests), set up
 * from the environment:
 *
 *   S3_ENDPOINT            e.g. http://127.0.0.1:4568 (omit for AWS itself)
 *   S3_PUBLIC_ENDPOINT     optional: the address browsers use, when it differs from S3_ENDPOINT
 *   S3_REGION              e.g. us-east-1
 *   S3_ACCESS_KEY_ID, S3_SECRET_ACCESS_KEY
 *   S3_BUCKET
 *   S3_FORCE_PATH_STYLE    "true" for http://host/bucket/key addresses (the stand-in needs it)
 *
 * Objects are private. Browsers reach them only through short-lived presigned URLs that the app
 * hands out after its own permission check.
 */
import {
	DeleteObjectCommand,
	GetObjectCommand,
	HeadObjectCommand,
	ListObjectsV2Command,
	NotFound,
	NoSuchKey,
	PutObjectCommand,
	S3Client,
	S3ServiceException
} from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';

export interface StorageConfig {
	endpoint: string | undefined;
	publicEndpoint: string | undefined;
	region: string;
	accessKeyId: string;
	secretAccessKey: string;
	bucket: string;
	forcePathStyle: boolean;
}

/** Thrown when the environment does not say where the storage is. */
export class StorageConfigError extends Error {}

/** Reads the settings; throws StorageConfigError naming what is missing. */
export function storageConfig(env: NodeJS.ProcessEnv = process.env): StorageConfig {
	const missing = ['S3_REGION', 'S3_ACCESS_KEY_ID', 'S3_SECRET_ACCESS_KEY', 'S3_BUCKET'].filter((k) => !env[k]);
	if (missing.length) throw new StorageConfigError(`Object storage is not set up: ${missing.join(', ')} missing from the environment.`);
	return {
		endpoint: env.S3_ENDPOINT || undefined,
		publicEndpoint: env.S3_PUBLIC_ENDPOINT || undefined,
		region: env.S3_REGION as string,
		accessKeyId: env.S3_ACCESS_KEY_ID as string,
		secretAccessKey: env.S3_SECRET_ACCESS_KEY as string,
		bucket: env.S3_BUCKET as string,
		forcePathStyle: /^(1|true|yes)$/i.test(env.S3_FORCE_PATH_STYLE ?? '')
	};
}

function makeClient(c: StorageConfig, endpoint: string | undefined): S3Client {
	return new S3Client({
		endpoint,
		region: c.region,
		forcePathStyle: c.forcePathStyle,
		credentials: { accessKeyId: c.accessKeyId, secretAccessKey: c.secretAccessKey },
		// Newer SDKs add checksum headers to every PUT by default; a browser holding a presigned URL
		// cannot send them, and not every S3-compatible service accepts them.
		requestChecksumCalculation: 'WHEN_REQUIRED',
		responseChecksumValidation: 'WHEN_REQUIRED'
	});
}

interface Clients {
	config: StorageConfig;
	/** For the server's own requests. */
	server: S3Client;
	/** For URLs handed to browsers (same as `server` unless S3_PUBLIC_ENDPOINT is set). */
	browser: S3Client;
}

let clients: Clients | undefined;

function get(): Clients {
	if (!clients) {
		const config = storageConfig();
		const server = makeClient(config, config.endpoint);
		const browser = config.publicEndpoint ? makeClient(config, config.publicEndpoint) : server;
		clients = { config, server, browser };
	}
	return clients;
}

/** Forget the clients (tests that change the environment). */
export function resetStorage(): void {
	clients = undefined;
}

export function bucket(): string {
	return get().config.bucket;
}

/**
 * A URL the browser can PUT the file to for `expiresIn` seconds. The content type (and the length,
 * when given) are signed, so the PUT must send exactly those headers: a service that checks
 * signatures strictly refuses anything else.
 */
export async function presignPut(key: string, o: { contentType: string; contentLength?: number; expiresIn: number }): Promise<string> {
	const { browser, config } = get();
	const command = new PutObjectCommand({ Bucket: config.bucket, Key: key, ContentType: o.contentType, ContentLength: o.contentLength });
	return getSignedUrl(browser, command, { expiresIn: o.expiresIn, signableHeaders: new Set(['content-type']) });
}

/** A URL the browser can GET the object from for `expiresIn` seconds. */
export async function presignGet(
	key: string,
	o: { expiresIn: number; contentType?: string; disposition?: string; cacheControl?: string }
): Promise<string> {
	const { browser, config } = get();
	const command = new GetObjectCommand({
		Bucket: config.bucket,
		Key: key,
		ResponseContentType: o.contentType,
		ResponseContentDisposition: o.disposition,
		ResponseCacheControl: o.cacheControl
	});
	return getSignedUrl(browser, command, { expiresIn: o.expiresIn });
}

function isMissing(e: unknown): boolean {
	return e instanceof NoSuchKey || e instanceof NotFound || (e instanceof S3ServiceException && e.$metadata?.httpStatusCode === 404);
}

/** Size and type of an object, or null when there is none. */
export async function head(key: string): Promise<{ size: number; contentType: string | null } | null> {
	const { server, config } = get();
	try {
		const r = await server.send(new HeadObjectCommand({ Bucket: config.bucket, Key: key }));
		return { size: Number(r.ContentLength ?? 0), contentType: r.ContentType ?? null };
	} catch (e) {
		if (isMissing(e)) return null;
		throw e;
	}
}

/** The object's bytes, or null when there is none. Refuses (RangeError) an object over `maxBytes`. */
export async function read(key: string, maxBytes: number): Promise<Uint8Array | null> {
	const { server, config } = get();
	try {
		const r = await server.send(new GetObjectCommand({ Bucket: config.bucket, Key: key }));
		if (Number(r.ContentLength ?? 0) > maxBytes) {
			await r.Body?.transformToByteArray().catch(() => undefined);
			throw new RangeError(`Object ${key} is larger than ${maxBytes} bytes.`);
		}
		const bytes = r.Body ? await r.Body.transformToByteArray() : new Uint8Array();
		if (bytes.byteLength > maxBytes) throw new RangeError(`Object ${key} is larger than ${maxBytes} bytes.`);
		return bytes;
	} catch (e) {
		if (isMissing(e)) return null;
		throw e;
	}
}

export async function write(key: string, body: Uint8Array, o: { contentType: string; cacheControl?: string }): Promise<void> {
	const { server, config } = get();
	await server.send(new PutObjectCommand({ Bucket: config.bucket, Key: key, Body: body, ContentType: o.contentType, CacheControl: o.cacheControl }));
}

/**
 * Deletes objects; keys that do not exist are fine. One request per key (a few at a time): a photo
 * has at most three objects, and single deletes need no checksum header, which some S3-compatible
 * services lack.
 */
export async function remove(keys: (string | null | undefined)[]): Promise<void> {
	const wanted = [...new Set(keys.filter((k): k is string => Boolean(k)))];
	if (!wanted.length) return;
	const { server, config } = get();
	for (let i = 0; i < wanted.length; i += 8) {
		await Promise.all(wanted.slice(i, i + 8).map((Key) => server.send(new DeleteObjectCommand({ Bucket: config.bucket, Key }))));
	}
}

/** Every key that starts with `prefix` (all pages of the listing). */
export async function list(prefix: string): Promise<string[]> {
	const { server, config } = get();
	const keys: string[] = [];
	let token: string | undefined;
	do {
		const r = await server.send(new ListObjectsV2Command({ Bucket: config.bucket, Prefix: prefix, ContinuationToken: token }));
		for (const o of r.Contents ?? []) if (o.Key) keys.push(o.Key);
		token = r.IsTruncated ? r.NextContinuationToken : undefined;
	} while (token);
	return keys;
}
