// The parts of s3rver (which ships no types) that scripts/s3-standin.ts uses.
declare module 's3rver' {
	interface S3rverOptions {
		address?: string;
		port?: number;
		silent?: boolean;
		directory?: string;
		configureBuckets?: { name: string; configs?: string[] }[];
	}
	export default class S3rver {
		constructor(options: S3rverOptions);
		run(): Promise<unknown>;
		close(): Promise<void>;
	}
}
