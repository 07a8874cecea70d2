/**
 * A stand-in for the socket.io-client module in page tests (`vi.mock('socket.io-client', …)`):
 * `io()` returns a socket that records what the page emits, and lets a test play the server's part.
 */
type Listener = (payload?: unknown) => void;

export class FakeSocket {
  readonly emitted: Array<{ event: string; payload: unknown }> = [];
  connected = false;
  disconnected = false;
  private readonly listeners = new Map<string, Set<Listener>>();

  constructor(
    readonly url: string,
    readonly options: unknown,
  ) {}

  on(event: string, listener: Listener): this {
    if (!this.listeners.has(event)) this.listeners.set(event, new Set());
    this.listeners.get(event)?.add(listener);
    return this;
  }

  emit(event: string, payload?: unknown): this {
    this.emitted.push({ event, payload });
    return this;
  }

  removeAllListeners(): this {
    this.listeners.clear();
    return this;
  }

  disconnect(): this {
    this.connected = false;
    this.disconnected = true;
    return this;
  }

  /** The server's side: deliver an event to the page's listeners. */
  receive(event: string, payload?: unknown): void {
    for (const listener of this.listeners.get(event) ?? []) listener(payload);
  }

  /** The connection opens. */
  open(): void {
    this.connected = true;
    this.receive('connect');
  }
}

export const sockets: FakeSocket[] = [];

export function io(url: string, options: unknown): FakeSocket {
  const socket = new FakeSocket(url, options);
  sockets.push(socket);
  return socket;
}

/** The socket the page opened last. */
export function lastSocket(): FakeSocket {
  const socket = sockets.at(-1);
  if (!socket) throw new Error('the page opened no socket');
  return socket;
}
