import net from 'node:net';
import { freePort } from '../../server/scripts/mariadb.js';

/**
 * A TCP relay in front of the test database that can be cut and restored: cut() closes the listening port and every
 * relayed connection (as a killed database server would: the app's pooled connections are lost, new ones are refused),
 * restore() listens on the same port again.
 */
export interface FaultProxy {
  port: number;
  cut(): Promise<void>;
  restore(): Promise<void>;
  close(): Promise<void>;
}

export async function startFaultProxy(target: { host: string; port: number }): Promise<FaultProxy> {
  const sockets = new Set<net.Socket>();
  let server: net.Server | null = null;
  let port = 0;
  const listen = () =>
    new Promise<void>((resolve, reject) => {
      const s = net.createServer((client) => {
        const upstream = net.connect(target.port, target.host);
        sockets.add(client).add(upstream);
        const drop = () => {
          client.destroy();
          upstream.destroy();
          sockets.delete(client);
          sockets.delete(upstream);
        };
        client.on('error', drop).on('close', drop);
        upstream.on('error', drop).on('close', drop);
        client.pipe(upstream).pipe(client);
      });
      s.once('error', reject);
      s.listen(port, '127.0.0.1', () => {
        const a = s.address();
        port = typeof a === 'object' && a ? a.port : port;
        server = s;
        resolve();
      });
    });
  const cut = async () => {
    const s = server;
    server = null;
    for (const sock of sockets) sock.destroy();
    sockets.clear();
    if (s) await new Promise<void>((r) => s.close(() => r()));
  };
  await listen();
  return {
    get port() {
      return port;
    },
    cut,
    restore: listen,
    close: cut,
  };
}

/** A port nothing listens on (bound once, then released). */
export const closedPort = freePort;

/** A TCP server that accepts connections and never says a word (a hung database), or closes each at once. */
export async function silentServer(mode: 'silent' | 'hang-up'): Promise<{ port: number; close(): Promise<void> }> {
  const sockets = new Set<net.Socket>();
  const s = net.createServer((sock) => {
    sockets.add(sock);
    sock.on('error', () => undefined);
    if (mode === 'hang-up') sock.destroy();
  });
  await new Promise<void>((r) => s.listen(0, '127.0.0.1', () => r()));
  const a = s.address();
  return {
    port: typeof a === 'object' && a ? a.port : 0,
    close: async () => {
      for (const sock of sockets) sock.destroy();
      await new Promise<void>((r) => s.close(() => r()));
    },
  };
}
