import { createInterface } from 'node:readline';
import { loadRun } from './load.js';

// The bench's load generator in its own process (see startLoadChild): one JSON line { url, connections, seconds,
// headers } on stdin a run, one JSON line back (the figure, or { error }), one run at a time.
const lines = createInterface({ input: process.stdin });
let queue = Promise.resolve();
lines.on('line', (line) => {
  queue = queue.then(async () => {
    const { url, connections, seconds, headers } = JSON.parse(line) as { url: string; connections: number; seconds: number; headers: Record<string, string> };
    try {
      process.stdout.write(`${JSON.stringify(await loadRun(url, connections, seconds, headers))}\n`);
    } catch (err) {
      process.stdout.write(`${JSON.stringify({ error: err instanceof Error ? err.message : String(err) })}\n`);
    }
  });
});
