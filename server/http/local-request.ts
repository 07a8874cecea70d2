import type { IncomingHttpHeaders } from 'node:http';
import { isLoopbackHost } from '../config';

/**
 * Headers a proxy adds (or a client forges) to say who the request is "really" from. Their
 * presence means the request passed through something: it is not a plain local request.
 */
export const FORWARDING_HEADERS = [
  'forwarded',
  'x-forwarded-for',
  'x-forwarded-host',
  'x-forwarded-proto',
  'x-forwarded-port',
  'x-forwarded-server',
  'x-forwarded',
  'forwarded-for',
  'x-real-ip',
  'x-client-ip',
  'client-ip',
  'true-client-ip',
  'cf-connecting-ip',
  'fastly-client-ip',
  'x-cluster-client-ip',
  'x-originating-ip',
  'via',
] as const;

/**
 * True only for a request from this machine: the socket's own peer address is loopback
 * (127.0.0.0/8, ::1, ::ffff:127.x) and no forwarding header is present. The decision never reads
 * a forwarding header's claimed address, nor Express's `request.ip` (which `trust proxy` changes).
 */
export function isLocalRequest(request: { socket: { remoteAddress?: string }; headers: IncomingHttpHeaders }): boolean {
  const peer = request.socket.remoteAddress;
  if (!peer || peer === 'localhost' || !isLoopbackHost(peer)) return false;
  return FORWARDING_HEADERS.every((name) => request.headers[name] === undefined);
}
