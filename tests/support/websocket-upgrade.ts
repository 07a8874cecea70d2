import WebSocket from 'ws';

/**
 * Opens a raw websocket and reports how the upgrade ended: 101 when it opened (then closes it), or
 * the HTTP status the server refused it with.
 */
export function websocketUpgradeStatus(url: string, options: { headers?: Record<string, string>; origin?: string } = {}): Promise<number> {
  return new Promise((resolve) => {
    const socket = new WebSocket(url, { headers: options.headers, ...(options.origin ? { origin: options.origin } : {}) });
    socket.on('unexpected-response', (_request, response) => {
      resolve(response.statusCode ?? 0);
      socket.terminate();
    });
    socket.on('open', () => {
      resolve(101);
      socket.close();
    });
    socket.on('error', () => undefined);
  });
}
