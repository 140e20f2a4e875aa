import 'server-only';
import { z } from 'zod';

const envSchema = z
  .object({
    NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
    DB_HOST: z.string().default('127.0.0.1'),
    DB_PORT: z.coerce.number().int().positive().default(3307),
    DB_NAME: z.string().min(1).default('takeproof'),
    DB_USER: z.string().min(1).default('takeproof'),
    DB_PASSWORD: z.string().default(''),
    NEXTAUTH_SECRET: z.string().min(1, 'NEXTAUTH_SECRET must be set'),
    /** `s3`: takes and waveform files in an S3-compatible bucket; `local`: files below STORAGE_DIR (one machine only). */
    STORAGE_DRIVER: z.enum(['s3', 'local']).default('s3'),
    /** Where earlier versions kept takes on local disk (read by `npm run storage:migrate`), and the `local` driver's folder. */
    STORAGE_DIR: z.string().default('var/storage'),
    /** Empty: the provider's own endpoint for S3_REGION (AWS). */
    S3_ENDPOINT: z.union([z.literal(''), z.string().url()]).default(''),
    S3_REGION: z.string().min(1).default('us-east-1'),
    S3_BUCKET: z.string().min(3).default('takeproof'),
    S3_ACCESS_KEY_ID: z.string().default(''),
    S3_SECRET_ACCESS_KEY: z.string().default(''),
    /** `true` for most self-hosted services: bucket in the path (host/bucket/key) instead of the host name. */
    S3_FORCE_PATH_STYLE: z.enum(['true', 'false']).default('true').transform((v) => v === 'true'),
    UPLOAD_MAX_BYTES: z.coerce.number().int().positive().default(8 * 1024 ** 3),
    /** Where the bytes of unfinished resumable (tus) uploads collect until their last byte is in. */
    UPLOAD_RESUME_DIR: z.string().default('var/uploads'),
    /** An unfinished resumable upload this old is removed (hours after it was started). */
    UPLOAD_RESUME_EXPIRY_HOURS: z.coerce.number().positive().default(24),
    SMTP_URL: z.string().default('smtp://127.0.0.1:2525'),
    MAIL_FROM: z.string().default('Takeproof <takeproof@demo.test>'),
    MAIL_OUTBOX_DIR: z.string().default('var/mail'),
    /** The address people open; links in e-mails are built from it. */
    NEXTAUTH_URL: z.string().url().default('http://127.0.0.1:3000'),
  });

export type Env = z.infer<typeof envSchema>;

let cached: Env | undefined;

/** The validated configuration; throws one readable message listing every bad variable. */
export function env(): Env {
  if (cached) return cached;
  const parsed = envSchema.safeParse(process.env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
    throw new Error(`Takeproof configuration is invalid:\n  ${lines.join('\n  ')}`);
  }
  cached = parsed.data;
  return cached;
}
