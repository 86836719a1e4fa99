import { mailReachable } from './mail'
import { sharedProbe } from './shared-probe'
import { storageReachable } from './storage'

const PROBE_MAX_AGE_MS = Number(process.env.HEALTH_PROBE_MAX_AGE_MS ?? 5000)

export const probeStorage = sharedProbe(storageReachable, PROBE_MAX_AGE_MS)
export const probeMail = sharedProbe(mailReachable, PROBE_MAX_AGE_MS)
