// Deployment settings come from the environment at run time (never baked into the
// build), so one build serves every environment. See README "Configuration".
export interface AppConfig {
  demo: boolean
  baseUrl: string
  databaseUrl: string
  s3: { endpoint?: string, region: string, bucket: string, accessKeyId?: string, secretAccessKey?: string, forcePathStyle: boolean }
  smtpUrl: string
  mailFrom: string
  mailCatcherDir?: string
}

export function readAppConfig(env: NodeJS.ProcessEnv = process.env): AppConfig {
  return {
    demo: env.PULLSHEET_DEMO === '1',
    baseUrl: (env.BASE_URL ?? `http://127.0.0.1:${env.PORT ?? 3000}`).replace(/\/$/, ''),
    databaseUrl: env.DATABASE_URL ?? '',
    s3: {
      endpoint: env.S3_ENDPOINT || undefined,
      region: env.S3_REGION ?? 'us-east-1',
      bucket: env.S3_BUCKET ?? 'pullsheet',
      accessKeyId: env.S3_ACCESS_KEY_ID || undefined,
      secretAccessKey: env.S3_SECRET_ACCESS_KEY || undefined,
      forcePathStyle: env.S3_FORCE_PATH_STYLE === 'true',
    },
    smtpUrl: env.SMTP_URL ?? '',
    mailFrom: env.MAIL_FROM ?? 'Pullsheet <no-reply@pullsheet.example>',
    mailCatcherDir: env.MAIL_CATCHER_DIR || undefined,
  }
}

/** Problems that stop a production server from starting; empty when all is set. */
export function missingProductionSettings(env: NodeJS.ProcessEnv = process.env): string[] {
  const missing: string[] = []
  if (!env.NUXT_SESSION_PASSWORD || env.NUXT_SESSION_PASSWORD.length < 32) missing.push('NUXT_SESSION_PASSWORD (32+ characters)')
  if (!env.DATABASE_URL) missing.push('DATABASE_URL')
  if (!env.BASE_URL) missing.push('BASE_URL')
  if (!env.SMTP_URL) missing.push('SMTP_URL')
  if (!env.S3_BUCKET) missing.push('S3_BUCKET')
  return missing
}

let cached: AppConfig | undefined
export function appConfig(): AppConfig {
  cached ??= readAppConfig()
  return cached
}
