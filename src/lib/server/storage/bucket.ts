/**
 * Files in an S3-compatible bucket through the AWS SDK. PADDOCK_STORAGE_URL names it:
 * `s3://bucket/optional/prefix?region=eu-west-1`, plus `endpoint=https://…` for any other
 * S3-compatible service (path-style addressing then). Credentials come from the URL's user and
 * password when given, else from the SDK's usual chain (AWS_ACCESS_KEY_ID…, instance roles).
 * An object appears whole or not at all, so nothing is ever half-written under a key.
 */
import {
	DeleteObjectCommand,
	GetObjectCommand,
	HeadBucketCommand,
	HeadObjectCommand,
	ListObjectsV2Command,
	PutObjectCommand,
	S3Client,
	S3ServiceException
} from '@aws-sdk/client-s3';
import { Readable } from 'node:stream';
import { StorageMissingError, StorageUnavailableError, type Storage } from './store';

export interface BucketAddress {
	bucket: string;
	prefix: string;
	region: string;
	endpoint?: string;
	credentials?: { accessKeyId: string; secretAccessKey: string };
}

export function parseStorageUrl(url: string): BucketAddress {
	let u: URL;
	try {
		u = new URL(url);
	} catch {
		throw new Error('PADDOCK_STORAGE_URL is not a URL: expected s3://bucket/prefix?region=…&endpoint=…');
	}
	if (u.protocol !== 's3:' || !u.hostname) throw new Error('PADDOCK_STORAGE_URL must start with s3://bucket');
	const prefix = decodeURIComponent(u.pathname).replace(/^\/+|\/+$/g, '');
	return {
		bucket: u.hostname,
		prefix: prefix ? `${prefix}/` : '',
		region: u.searchParams.get('region') ?? process.env.AWS_REGION ?? 'us-east-1',
		endpoint: u.searchParams.get('endpoint') ?? undefined,
		credentials: u.username
			? { accessKeyId: decodeURIComponent(u.username), secretAccessKey: decodeURIComponent(u.password) }
			: undefined
	};
}

const NETWORK = new Set(['ECONNREFUSED', 'ECONNRESET', 'ENOTFOUND', 'EAI_AGAIN', 'ETIMEDOUT', 'EHOSTUNREACH', 'ENETUNREACH', 'EPIPE']);

export function bucketStorage(url: string): Storage {
	const at = parseStorageUrl(url);
	// The SDK's version is pinned and supports Node 20; its notice about later versions is noise in the start-up log.
	process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= 'true';
	const client = new S3Client({
		region: at.region,
		endpoint: at.endpoint,
		forcePathStyle: !!at.endpoint,
		credentials: at.credentials,
		maxAttempts: 2,
		requestHandler: { connectionTimeout: 3000, requestTimeout: 60_000 },
		// Checksums only where S3 requires them: other S3-compatible stores know no others.
		requestChecksumCalculation: 'WHEN_REQUIRED',
		responseChecksumValidation: 'WHEN_REQUIRED'
	});
	const name = `the bucket ${at.bucket}${at.endpoint ? ` at ${new URL(at.endpoint).host}` : ''}`;
	const full = (key: string) => at.prefix + key;

	/** Missing → StorageMissingError; the store out of reach → StorageUnavailableError. */
	const translate = (e: unknown, key?: string): Error => {
		const err = e as S3ServiceException & { code?: string; $metadata?: { httpStatusCode?: number } };
		const status = err.$metadata?.httpStatusCode;
		if (key && (err.name === 'NoSuchKey' || err.name === 'NotFound' || status === 404)) return new StorageMissingError(`No stored file ${key}`);
		if (NETWORK.has(err.code ?? '') || NETWORK.has((err as { errno?: string }).errno ?? '') || (status && status >= 500) || err.name === 'TimeoutError' || !status) {
			return new StorageUnavailableError(`Cannot reach ${name}: ${err.code ?? err.name ?? 'no answer'}`);
		}
		return err;
	};

	async function head(key: string): Promise<boolean> {
		try {
			await client.send(new HeadObjectCommand({ Bucket: at.bucket, Key: full(key) }));
			return true;
		} catch (e) {
			const t = translate(e, key);
			if (t instanceof StorageMissingError) return false;
			throw t;
		}
	}

	return {
		name,
		async putOnce(key, bytes, contentType) {
			if (await head(key)) return;
			try {
				await client.send(new PutObjectCommand({ Bucket: at.bucket, Key: full(key), Body: bytes, ContentType: contentType, ContentLength: bytes.byteLength }));
			} catch (e) {
				throw translate(e);
			}
		},
		async get(key) {
			try {
				const out = await client.send(new GetObjectCommand({ Bucket: at.bucket, Key: full(key) }));
				return await out.Body!.transformToByteArray();
			} catch (e) {
				throw translate(e, key);
			}
		},
		async open(key) {
			try {
				const out = await client.send(new GetObjectCommand({ Bucket: at.bucket, Key: full(key) }));
				return { body: out.Body as Readable, bytes: out.ContentLength ?? 0 };
			} catch (e) {
				throw translate(e, key);
			}
		},
		has: head,
		async list(prefix) {
			const keys: string[] = [];
			let token: string | undefined;
			try {
				do {
					const out = await client.send(new ListObjectsV2Command({ Bucket: at.bucket, Prefix: full(prefix), ContinuationToken: token }));
					for (const o of out.Contents ?? []) if (o.Key) keys.push(o.Key.slice(at.prefix.length));
					token = out.IsTruncated ? out.NextContinuationToken : undefined;
				} while (token);
			} catch (e) {
				throw translate(e);
			}
			return keys.sort();
		},
		async remove(key) {
			try {
				await client.send(new DeleteObjectCommand({ Bucket: at.bucket, Key: full(key) }));
			} catch (e) {
				const t = translate(e, key);
				if (!(t instanceof StorageMissingError)) throw t;
			}
		},
		async ping() {
			try {
				await client.send(new HeadBucketCommand({ Bucket: at.bucket }));
			} catch (e) {
				const t = translate(e);
				throw t instanceof StorageUnavailableError ? t : new StorageUnavailableError(`Cannot use ${name}: ${t.message || t.name}`);
			}
		}
	};
}
