import { monitorEventLoopDelay, type ELDHistogram } from 'node:perf_hooks'
import type { ListingCheck } from './storage-privacy'
import { keptRenderCounts, type KeptRenderCounts } from '~~/shared/utils/kept-render-counts'
import { photoJobsActive } from '~~/server/services/photos/jobs'
import { pullCheckStats } from '~~/server/services/workspace/pull-pool'

// How long the event loop was held up since the last reset, and how much memory
// the process holds: the figures the photo benchmark reads (bench/photos.bench.ts).
let histogram: ELDHistogram | undefined
let since = Date.now()

export function startRuntimeMonitor(): void {
  if (histogram) return
  histogram = monitorEventLoopDelay({ resolution: 10 })
  histogram.enable()
}

export function resetRuntimeStats(): void {
  histogram?.reset()
  since = Date.now()
}

const mb = (bytes: number) => Math.round((bytes / 1024 / 1024) * 10) / 10
const ms = (ns: number) => Math.round((ns / 1e6) * 10) / 10

export interface RuntimeStats {
  eventLoop: { sinceMs: number, maxDelayMs: number, p99DelayMs: number, meanDelayMs: number }
  memory: { rssMb: number, heapUsedMb: number, externalMb: number, arrayBuffersMb: number }
  photoJobs: { active: number }
  pullChecks: ReturnType<typeof pullCheckStats>
  /** What the start-up check found: can the bucket be listed without credentials? */
  storageListing: ListingCheck
  /** Server renders of kept subtrees (the reader's article) made and reused, since the process started. */
  keptRenders: KeptRenderCounts
}

export function runtimeStats(): RuntimeStats {
  const memory = process.memoryUsage()
  return {
    eventLoop: {
      sinceMs: Date.now() - since,
      // The histogram counts from the timer's due time, so its max is the longest stall.
      maxDelayMs: histogram ? ms(histogram.max) : 0,
      p99DelayMs: histogram ? ms(histogram.percentile(99)) : 0,
      meanDelayMs: histogram && histogram.count ? ms(histogram.mean) : 0,
    },
    memory: { rssMb: mb(memory.rss), heapUsedMb: mb(memory.heapUsed), externalMb: mb(memory.external), arrayBuffersMb: mb(memory.arrayBuffers) },
    photoJobs: { active: photoJobsActive() },
    pullChecks: pullCheckStats(),
    storageListing: bucketListingCheck(),
    keptRenders: keptRenderCounts,
  }
}
