import net from 'node:net'

/** A port the kernel says is free on loopback right now. */
export function freePort(host = '127.0.0.1'): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer()
    srv.unref()
    srv.on('error', reject)
    srv.listen(0, host, () => {
      const addr = srv.address()
      srv.close(() => (addr && typeof addr === 'object' ? resolve(addr.port) : reject(new Error('no port'))))
    })
  })
}

/** `n` different free ports: each is held open until all are known, so no two are the same. */
export async function freePorts(n: number, host = '127.0.0.1'): Promise<number[]> {
  const servers = await Promise.all(
    Array.from(
      { length: n },
      () =>
        new Promise<net.Server>((resolve, reject) => {
          const srv = net.createServer()
          srv.unref()
          srv.on('error', reject)
          srv.listen(0, host, () => resolve(srv))
        }),
    ),
  )
  const ports = servers.map((s) => (s.address() as net.AddressInfo).port)
  await Promise.all(servers.map((s) => new Promise((r) => s.close(r))))
  return ports
}

export function isPortFree(port: number, host = '127.0.0.1'): Promise<boolean> {
  return new Promise((resolve) => {
    const srv = net.createServer()
    srv.unref()
    srv.once('error', () => resolve(false))
    srv.listen(port, host, () => srv.close(() => resolve(true)))
  })
}
