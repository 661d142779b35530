import http from 'node:http';

/**
 * An agent that opens a new connection for every request. Node's default agent keeps sockets
 * alive; when a test blocks the event loop (it runs the server in-process) past the server's
 * keep-alive timeout, the next request can be written onto a socket the server is just closing
 * and fail with ECONNRESET. Timing suites use this agent for their raw requests.
 */
export const freshConnections = new http.Agent({ keepAlive: false });

/** The 99th percentile of a list of timings (the largest for fewer than 100). */
export function p99(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.floor(sorted.length * 0.99))]!;
}

/** One server-sent event as a test reads it. */
export interface SseEvent {
  event: string;
  data: Record<string, unknown>;
}

/**
 * A reader of a server-sent event stream for tests: feed it the stream's chunks as they arrive;
 * it calls `onEvent` for every complete `event:`/`data:` block.
 */
export function sseReader(onEvent: (e: SseEvent) => void): (chunk: Buffer) => void {
  let text = '';
  return (chunk) => {
    text += chunk.toString('utf8');
    let cut: number;
    while ((cut = text.indexOf('\n\n')) >= 0) {
      const block = text.slice(0, cut);
      text = text.slice(cut + 2);
      const event = /^event: (.*)$/m.exec(block)?.[1] ?? '';
      onEvent({ event, data: JSON.parse(/^data: (.*)$/m.exec(block)?.[1] ?? '{}') });
    }
  };
}
