import pg from 'pg';
import type { EntityManager } from '@mikro-orm/postgresql';

/** What travels between server processes about one chain (as JSON in a NOTIFY payload). */
export type ChainEvent =
  | { type: 'presence'; chainId: string }
  | { type: 'saved'; chainId: string; version: number; by: string; byUserId: string }
  | { type: 'comments'; chainId: string; by: string };

type Listener = (event: ChainEvent) => void;

/** The NOTIFY channel of a database schema (tests give each file a schema of its own). */
export function eventChannel(schema: string | undefined): string {
  return `cw_events_${schema ?? 'public'}`;
}

/**
 * Tells every server process about a chain event: PostgreSQL delivers the NOTIFY to each
 * process listening on the channel (this one included) once the transaction commits.
 */
export async function publishChainEvent(em: EntityManager, event: ChainEvent): Promise<void> {
  const schema = em.config.get('schema') as string | undefined;
  await em
    .getConnection()
    .execute('select pg_notify(?, ?)', [eventChannel(schema), JSON.stringify(event)]);
}

/**
 * This process's LISTEN connection: one dedicated client, opened for the first subscriber,
 * fanning notifications out to the streams that have the chain open.
 */
export class EventHub {
  private readonly channel: string;
  private client: pg.Client | null = null;
  private connecting: Promise<pg.Client> | null = null;
  private readonly listeners = new Map<string, Set<Listener>>();
  private closed = false;

  constructor(
    private readonly databaseUrl: string,
    schema: string | undefined,
  ) {
    this.channel = eventChannel(schema);
  }

  /** Listens for events about `chainId`; resolves once LISTEN is in place. Returns the unsubscribe. */
  async subscribe(chainId: string, listener: Listener): Promise<() => void> {
    let set = this.listeners.get(chainId);
    if (!set) this.listeners.set(chainId, (set = new Set()));
    set.add(listener);
    await this.connect();
    return () => {
      set.delete(listener);
      if (set.size === 0) this.listeners.delete(chainId);
    };
  }

  private connect(): Promise<pg.Client> {
    if (this.client) return Promise.resolve(this.client);
    this.connecting ??= (async () => {
      const client = new pg.Client({ connectionString: this.databaseUrl });
      client.on('notification', (msg) => this.dispatch(msg.payload));
      client.on('error', (err) => {
        console.error('[server] event listener connection lost:', err.message);
        this.client = null;
        client.end().catch(() => undefined);
        // Streams still open get events again once a new connection listens.
        if (!this.closed && this.listeners.size > 0) {
          setTimeout(() => void this.connect().catch(() => undefined), 2000).unref();
        }
      });
      await client.connect();
      await client.query(`listen "${this.channel.replace(/"/g, '""')}"`);
      this.client = client;
      return client;
    })().finally(() => {
      this.connecting = null;
    });
    return this.connecting;
  }

  private dispatch(payload: string | undefined): void {
    if (!payload) return;
    let event: ChainEvent;
    try {
      event = JSON.parse(payload) as ChainEvent;
    } catch {
      return;
    }
    for (const listener of this.listeners.get(event.chainId) ?? []) listener(event);
  }

  /** Whether close() was called (the process is stopping; late failures are expected). */
  get isClosed(): boolean {
    return this.closed;
  }

  async close(): Promise<void> {
    this.closed = true;
    this.listeners.clear();
    const client =
      this.client ?? (this.connecting ? await this.connecting.catch(() => null) : null);
    this.client = null;
    if (client) await client.end().catch(() => undefined);
  }
}
