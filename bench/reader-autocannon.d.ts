// The part of autocannon's API the reader benchmark uses (it ships no types).
declare module 'autocannon' {
  interface Histogram { average: number, p50: number, p99: number }
  interface Result { requests: Histogram, latency: Histogram, non2xx: number, errors: number }
  function autocannon(opts: { url: string, connections: number, duration: number, headers?: Record<string, string> }): Promise<Result>
  export default autocannon
}
