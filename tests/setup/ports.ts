import net from 'node:net'

/** A TCP port on 127.0.0.1 that nothing listens on right now. */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer()
    server.once('error', reject)
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as net.AddressInfo
      server.close(() => resolve(port))
    })
  })
}

/** `preferred` when it is free, else the next free port above it. */
export async function freePortFrom(preferred: number): Promise<number> {
  for (let port = preferred; port < preferred + 200; port++) {
    const free = await new Promise<boolean>((resolve) => {
      const server = net.createServer()
      server.once('error', () => resolve(false))
      server.listen(port, '127.0.0.1', () => server.close(() => resolve(true)))
    })
    if (free) return port
  }
  return freePort()
}
