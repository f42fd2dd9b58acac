/**
 * A loopback TCP proxy between the app and the tests' PostgreSQL, so a test can take the database
 * away (`cut`), bring it back (`restore`), or break one connection at a chosen moment: right after
 * PostgreSQL has carried out a statement and before its answer reaches the app (`breakAfterSending`).
 */
import net from 'node:net';
import { inject } from 'vitest';
import { createDb, type Db } from '../../server/db/knex';
import { startTestApp, type TestApp } from './app';
import { createOrgWithMembers, type TestOrg } from './auth';

export interface PgProxy {
  /** DATABASE_URL for the app, through the proxy. */
  url: string;
  /** Drops every connection and refuses new ones until `restore`. */
  cut(): void;
  restore(): void;
  /**
   * The next message from the app containing `marker` reaches PostgreSQL, and its answer is thrown
   * away as the connection is broken. Resolves once that happened.
   */
  breakAfterSending(marker: string): Promise<void>;
  close(): Promise<void>;
}

export async function startPgProxy(databaseUrl: string): Promise<PgProxy> {
  const url = new URL(databaseUrl);
  const pgPort = Number(url.port);
  const sockets = new Set<net.Socket>();
  let up = true;
  let armed: { marker: string; tripped: () => void } | undefined;

  const proxy = net.createServer((client) => {
    if (!up) return void client.destroy();
    const server = net.connect(pgPort, '127.0.0.1');
    sockets.add(client).add(server);
    let breakOnAnswer: (() => void) | undefined;
    client.on('data', (chunk) => {
      server.write(chunk);
      if (armed && chunk.includes(armed.marker)) {
        breakOnAnswer = armed.tripped;
        armed = undefined;
      }
    });
    server.on('data', (chunk) => {
      if (!breakOnAnswer) return void client.write(chunk);
      end();
      breakOnAnswer();
    });
    const end = () => {
      client.destroy();
      server.destroy();
    };
    client.on('error', end).on('close', end);
    server.on('error', end).on('close', end);
  });
  await new Promise<void>((r) => proxy.listen(0, '127.0.0.1', () => r()));
  url.searchParams.delete('host');
  url.host = `127.0.0.1:${(proxy.address() as net.AddressInfo).port}`;

  return {
    url: url.toString(),
    cut() {
      up = false;
      for (const s of sockets) s.destroy();
      sockets.clear();
    },
    restore() {
      up = true;
    },
    breakAfterSending(marker) {
      return new Promise<void>((tripped) => (armed = { marker, tripped }));
    },
    close() {
      up = true;
      for (const s of sockets) s.destroy();
      return new Promise<void>((r) => proxy.close(() => r()));
    },
  };
}

export interface AppThroughProxy {
  t: TestApp;
  /** A connection that does not go through the proxy, for set-up and checks. */
  direct: Db;
  proxy: PgProxy;
  org: TestOrg;
  close(): Promise<void>;
}

/** The app reaching the tests' PostgreSQL through a proxy, a direct connection, and a firm with one member per role. */
export async function startAppThroughProxy(overrides: Record<string, string> = {}): Promise<AppThroughProxy> {
  const direct = createDb(inject('testEnv').DATABASE_URL);
  const proxy = await startPgProxy(inject('testEnv').DATABASE_URL);
  const t = await startTestApp({ DATABASE_URL: proxy.url, ...overrides });
  const org = await createOrgWithMembers(direct);
  return {
    t,
    direct,
    proxy,
    org,
    async close() {
      proxy.restore();
      await t.close();
      await direct.destroy();
      await proxy.close();
    },
  };
}
