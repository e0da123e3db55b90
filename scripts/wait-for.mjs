// Waits until a URL answers 200, or fails after the given number of seconds.
const [url, seconds = '60'] = process.argv.slice(2);
const deadline = Date.now() + Number(seconds) * 1000;
while (Date.now() < deadline) {
  try {
    if ((await fetch(url)).ok) process.exit(0);
  } catch {
    // not up yet
  }
  await new Promise((r) => setTimeout(r, 300));
}
console.error(`${url} did not answer within ${seconds} s`);
process.exit(1);
