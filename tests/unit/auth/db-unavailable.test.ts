import { describe, expect, it } from 'vitest'
import { isDatabaseUnavailable } from '../../../server/utils/db-unavailable'

// Error shapes as Node's net module and the mysql2 driver produce them (from memory,
// confirmed by the fault drills in tests/api/zz-faults-*.test.ts).
const refused = (port: number, extra: object = {}) => Object.assign(new Error(`connect ECONNREFUSED 127.0.0.1:${port}`), { code: 'ECONNREFUSED', port, syscall: 'connect', ...extra })

describe('isDatabaseUnavailable', () => {
  it('is true for a refused connection to the database port, also as a cause', () => {
    expect(isDatabaseUnavailable(refused(3317), 3317)).toBe(true)
    expect(isDatabaseUnavailable(new Error('wrapped', { cause: refused(3317) }), 3317)).toBe(true)
  })
  it('is true for the driver and the pool giving up', () => {
    expect(isDatabaseUnavailable(Object.assign(new Error('x'), { code: 'PROTOCOL_CONNECTION_LOST', fatal: true }), 3317)).toBe(true)
    expect(isDatabaseUnavailable(Object.assign(new Error('Knex: Timeout acquiring a connection.'), { name: 'KnexTimeoutError' }), 3317)).toBe(true)
  })
  it('is true for a rollback on a connection that died mid-transaction', () => {
    // mysql2 lib/base/connection.js, _addCommandClosedState (the message and fatal flag it sets);
    // knex prefixes the statement. Seen in the database fault drill with an import in flight.
    const closed = Object.assign(new Error('ROLLBACK - Can\'t add new command when connection is in closed state'), { fatal: true })
    expect(isDatabaseUnavailable(closed, 3317)).toBe(true)
    expect(isDatabaseUnavailable(new Error('wrapped', { cause: closed }), 3317)).toBe(true)
  })
  it('is false for storage or mail refusing on their own ports', () => {
    expect(isDatabaseUnavailable(refused(4579), 3317)).toBe(false)
    expect(isDatabaseUnavailable(new Error('upload failed', { cause: refused(2535) }), 3317)).toBe(false)
  })
  it('is false for ordinary errors', () => {
    expect(isDatabaseUnavailable(Object.assign(new Error('dup'), { code: 'ER_DUP_ENTRY' }), 3317)).toBe(false)
    expect(isDatabaseUnavailable(undefined, 3317)).toBe(false)
  })
})
