import type { Knex } from 'knex'
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../../shared/utils/demo-accounts'

// Same hasher and defaults as nuxt-auth-utils' hashPassword, so the server verifies these.
const hasher = new Hash(new Scrypt({}))

export async function seed(knex: Knex): Promise<void> {
  const passwordHash = await hasher.make(DEMO_PASSWORD)
  for (const account of DEMO_ACCOUNTS) {
    await knex('users')
      .insert({ email: account.email, display_name: account.displayName, role: account.role, password_hash: passwordHash })
      .onConflict('email').ignore()
  }
}
