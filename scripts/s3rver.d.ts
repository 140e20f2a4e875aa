// The part of s3rver's API that scripts/s3-fake.ts uses (the package ships no types).
declare module 's3rver' {
  interface S3rverOptions {
    address?: string;
    port?: number;
    directory: string;
    silent?: boolean;
    configureBuckets?: { name: string }[];
  }
  export default class S3rver {
    constructor(options: S3rverOptions);
    run(): Promise<unknown>;
    close(): Promise<void>;
  }
}

declare module 's3rver/lib/models/account.js' {
  interface Account {
    createKeyPair(accessKeyId: string, secretAccessKey: string): void;
    revokeAccessKey(accessKeyId: string): void;
  }
  const AWSAccount: { DUMMY_ACCOUNT: Account };
  export default AWSAccount;
}
