// autocannon 9 ships no type declarations (and none are installed): the part the benchmark uses.
declare module 'autocannon' {
  namespace autocannon {
    type RawRequest = { method?: string; path?: string; headers?: Record<string, string>; body?: string }
    type Request = RawRequest & {
      setupRequest?: (req: RawRequest, context: Record<string, unknown>) => RawRequest
      onResponse?: (status: number, body: string, context: Record<string, unknown>) => void
    }
    type Options = {
      url: string
      connections?: number
      duration?: number
      headers?: Record<string, string>
      requests?: Request[]
    }
    type Histogram = { average: number; total: number; p50: number; p99: number }
    type Result = {
      requests: Histogram
      latency: Histogram
      non2xx: number
      errors: number
      timeouts: number
      '2xx': number
    }
  }
  function autocannon(opts: autocannon.Options): Promise<autocannon.Result>
  export default autocannon
}
