// npm run user:create -- email@example.org "Display Name" admin
// Creates an account in the database named by DATABASE_URL (or the local one) and
// prints a one-time password: the way to make the first admin of a real install.
import { randomBytes } from 'node:crypto'
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import { EmailSchema, RoleSchema } from '../shared/types/users'
import { scriptDb } from './lib/database'
import { localEnv, serverEnv } from './lib/env'

const [emailArg, name, roleArg = 'admin'] = process.argv.slice(2)
const email = EmailSchema.safeParse(emailArg)
const role = RoleSchema.safeParse(roleArg)
if (!email.success || !name || !role.success) {
  console.error('usage: npm run user:create -- <email> "<display name>" [reader|writer|editor|admin]')
  process.exit(2)
}
const db = scriptDb(process.env.DATABASE_URL ?? serverEnv(localEnv('local')).DATABASE_URL!)
const password = randomBytes(12).toString('base64url')
try {
  await db('users').insert({ email: email.data, display_name: name, role: role.data, password_hash: await new Hash(new Scrypt({})).make(password) })
  console.log(`created ${role.data} ${email.data}; one-time password: ${password} (change it under Account)`)
}
catch (error) {
  console.error((error as { code?: string }).code === 'ER_DUP_ENTRY' ? `${email.data} already has an account` : (error as Error).message)
  process.exitCode = 1
}
finally { await db.destroy() }
