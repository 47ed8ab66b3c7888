// Usage: node wait-http.mjs URL TIMEOUT_SECONDS [PID]
// Exits 0 once URL answers 200; 1 on timeout; 2 when PID (the server being waited for) has exited.
const [url, timeoutArg = '60', pidArg] = process.argv.slice(2);
if (!url) {
  console.error('usage: wait-http.mjs URL TIMEOUT_SECONDS [PID]');
  process.exit(64);
}
const deadline = Date.now() + Number(timeoutArg) * 1000;
const pid = pidArg ? Number(pidArg) : undefined;
let last = 'no answer';

function alive(p) {
  try {
    process.kill(p, 0);
    return true;
  } catch {
    return false;
  }
}

while (Date.now() < deadline) {
  if (pid !== undefined && !alive(pid)) {
    console.error(`The process being waited for (pid ${pid}) exited before ${url} answered.`);
    process.exit(2);
  }
  try {
    const res = await fetch(url, { signal: AbortSignal.timeout(2000) });
    if (res.status === 200) process.exit(0);
    last = `HTTP ${res.status}`;
  } catch (err) {
    last = err?.cause?.code ?? err?.message ?? String(err);
  }
  await new Promise((r) => setTimeout(r, 250));
}
console.error(`${url} did not answer 200 within ${timeoutArg} s (last: ${last}).`);
process.exit(1);
