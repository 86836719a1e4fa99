// CPU time of the servers a benchmark measures, from Linux's /proc: unlike latencies and
// rates, CPU per answer holds while other work shares the cores.
import { spawnSync } from 'node:child_process'
import { readdirSync, readFileSync } from 'node:fs'

/** Clock ticks per second of /proc's times (USER_HZ, 100 on Linux). */
const CLOCK_TICKS = Number(spawnSync('getconf', ['CLK_TCK'], { encoding: 'utf8' }).stdout) || 100

/**
 * CPU milliseconds (user + system) used so far by the processes of a process group (an
 * app server and its cluster's processes) or by the children of a process (an nginx
 * master's workers).
 */
export function processCpuMs(which: { group: number } | { parent: number }): number {
  let ticks = 0
  for (const pid of readdirSync('/proc')) {
    if (!/^\d+$/.test(pid)) continue
    let stat: string
    try {
      stat = readFileSync(`/proc/${pid}/stat`, 'utf8')
    }
    catch {
      continue // gone meanwhile
    }
    // After the command's ")": state, ppid, pgrp, ... utime (12th), stime (13th).
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ')
    const matches = 'group' in which ? Number(fields[2]) === which.group : Number(fields[1]) === which.parent
    if (matches) ticks += Number(fields[11]) + Number(fields[12])
  }
  return ticks * 1000 / CLOCK_TICKS
}
