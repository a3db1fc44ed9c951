import { createServer, connect, type Server, type Socket } from 'node:net';

export type SwitchingRelay = {
  url: string;
  /** Sends new connections to this port from now on; with `drop`, cuts every open one at once (a node dying). */
  switchTo: (port: number, options?: { drop?: boolean }) => void;
  close: () => Promise<void>;
};

/**
 * A loopback TCP relay standing in for the load balancer in front of the app nodes: every connection goes to
 * the current node. Written here rather than started as haproxy because a test needs to move it between nodes
 * and cut its connections at a chosen moment, which takes a dozen lines of node:net.
 */
export async function startSwitchingRelay(targetPort: number): Promise<SwitchingRelay> {
  let target = targetPort;
  const open = new Set<Socket>();
  const server: Server = createServer((client) => {
    const upstream = connect(target, '127.0.0.1');
    for (const s of [client, upstream]) {
      open.add(s);
      s.on('close', () => open.delete(s));
      s.on('error', () => undefined);
    }
    client.pipe(upstream).pipe(client);
    client.on('close', () => upstream.destroy());
    upstream.on('close', () => client.destroy());
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as { port: number };
  return {
    url: `http://127.0.0.1:${port}`,
    switchTo: (next, options) => {
      target = next;
      if (options?.drop) for (const s of open) s.destroy();
    },
    close: async () => {
      for (const s of open) s.destroy();
      await new Promise((resolve) => server.close(resolve));
    },
  };
}
