import { loadRun } from './load.js';

// One autocannon run in its own process: reads { url, connections, seconds, headers } as JSON on stdin, prints the
// figure as one JSON line (see loadRunInChild).
let input = '';
process.stdin.on('data', (d) => (input += d));
process.stdin.on('end', () => {
  const { url, connections, seconds, headers } = JSON.parse(input) as { url: string; connections: number; seconds: number; headers: Record<string, string> };
  loadRun(url, connections, seconds, headers).then(
    (figure) => process.stdout.write(`${JSON.stringify(figure)}\n`),
    (err: Error) => {
      process.stderr.write(`${err.message}\n`);
      process.exit(1);
    },
  );
});
