// Bench only: loaded into the bench's server process with `--import` (board.ts, when it measures /api/me under load),
// never by the app. It times each request inside the server, from Node's 'request' event (headers parsed) to
// 'finish' (the answer handed to the socket), and samples the event loop's delay (perf_hooks.monitorEventLoopDelay).
// SIGUSR2 writes what was measured since the last SIGUSR2 to BENCH_PROBE_FILE as JSON and starts afresh.
import fs from 'node:fs';
import http from 'node:http';
import { monitorEventLoopDelay } from 'node:perf_hooks';

const file = process.env.BENCH_PROBE_FILE;
if (file) {
  let loop = monitorEventLoopDelay({ resolution: 10 });
  loop.enable();
  let times: Record<string, number[]> = {};
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
    const ms = (ns: number) => ns / 1e6;
    const eventLoop = { p50: ms(loop.percentile(50)), p99: ms(loop.percentile(99)), max: ms(loop.max), mean: ms(loop.mean) };
    fs.writeFileSync(file, JSON.stringify({ eventLoop, times }));
    times = {};
    loop = monitorEventLoopDelay({ resolution: 10 });
    loop.enable();
  });
}
