// Bench only: loaded into the bench's server process with `--import` (board.ts, when it measures /api/me under load),
// never by the app. It times each request inside the server, from Node's 'request' event (headers parsed) to
// 'finish' (the answer handed to the socket), records garbage-collection pauses, and samples the event loop's delay (perf_hooks.monitorEventLoopDelay, beyond its 10 ms timer).
// SIGUSR2 writes what was measured since the last SIGUSR2 to BENCH_PROBE_FILE as JSON and starts afresh.
import fs from 'node:fs';
import http from 'node:http';
import { PerformanceObserver, monitorEventLoopDelay } from 'node:perf_hooks';

const file = process.env.BENCH_PROBE_FILE;
if (file) {
  let loop = monitorEventLoopDelay({ resolution: 10 });
  loop.enable();
  let times: Record<string, number[]> = {};
  let gc = { count: 0, total: 0, max: 0 };
  new PerformanceObserver((list) => {
    for (const entry of list.getEntries()) {
      gc.count++;
      gc.total += entry.duration;
      gc.max = Math.max(gc.max, entry.duration);
    }
  }).observe({ entryTypes: ['gc'] });
  const emit = http.Server.prototype.emit;
  http.Server.prototype.emit = function (this: http.Server, event: string | symbol, ...args: unknown[]) {
    if (event === 'request') {
      const [req, res] = args as [http.IncomingMessage, http.ServerResponse];
      const start = performance.now();
      const route = (req.url ?? '').split('?')[0]!;
      res.once('finish', () => (times[route] ??= []).push(performance.now() - start));
    }
    return (emit as (this: http.Server, event: string | symbol, ...args: unknown[]) => boolean).call(this, event, ...args);
  } as typeof emit;
  process.on('SIGUSR2', () => {
    loop.disable();
    // The histogram holds each whole timer interval, so the 10 ms resolution is taken off: what is left is the delay.
    const ms = (ns: number) => Math.max(0, ns / 1e6 - 10);
    const eventLoop = { p50: ms(loop.percentile(50)), p99: ms(loop.percentile(99)), max: ms(loop.max), mean: ms(loop.mean) };
    // Written whole, then renamed: the bench reads it as soon as the name appears.
    fs.writeFileSync(`${file}.tmp`, JSON.stringify({ eventLoop, gc, times }));
    fs.renameSync(`${file}.tmp`, file);
    times = {};
    gc = { count: 0, total: 0, max: 0 };
    loop = monitorEventLoopDelay({ resolution: 10 });
    loop.enable();
  });
}
