// Bench only: a light client in its own process that sends GET <url> at an even pace on one keep-alive connection,
// one request at a time, and prints each answer's time (ms, from sending to the last byte) as JSON on stdout.
// Its own process, so its timings do not wait behind the load generator's event loop; an even pace, so it samples
// the whole load period rather than bursts. Run: node --import tsx scripts/bench/paced-get.ts <url> <cookie> <per second> <seconds>
import http from 'node:http';

const [url, cookie, perSecond, seconds] = process.argv.slice(2);
const agent = new http.Agent({ keepAlive: true, maxSockets: 1 });
const interval = 1000 / Number(perSecond);
const count = Math.round(Number(seconds) * Number(perSecond));
const times: number[] = [];
let failed = 0;

function once(): Promise<void> {
  return new Promise((resolve) => {
    const start = performance.now();
    const req = http.get(url!, { agent, headers: { cookie: cookie! } }, (res) => {
      res.resume();
      res.on('end', () => {
        if (res.statusCode === 200) times.push(performance.now() - start);
        else failed++;
        resolve();
      });
    });
    req.on('error', () => {
      failed++;
      resolve();
    });
  });
}

/** The bench has gone (it failed): do not wait for it. */
function gone(): void {
  process.exit(1);
}

// Started from the bench with an IPC channel: say ready (tsx has loaded), then wait for the word to begin.
if (process.send) {
  process.once('disconnect', gone);
  process.send('ready');
  await new Promise((r) => process.once('message', r));
}
const begin = performance.now();
for (let k = 0; k < count; k++) {
  // The k-th request is due at begin + k × interval; a late one goes at once (never two at a time).
  const wait = begin + k * interval - performance.now();
  if (wait > 0) await new Promise((r) => setTimeout(r, wait));
  await once();
}
agent.destroy();
process.stdout.write(JSON.stringify({ times, failed }));
process.off('disconnect', gone);
process.disconnect?.();
