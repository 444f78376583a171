import { readFileSync } from 'node:fs';

/** Local addresses (e.g. "127.0.0.1", "0.0.0.0", "::") that listen on a TCP port, read from /proc/net/tcp{,6}. */
export function listeningAddresses(port: number): string[] {
  const out: string[] = [];
  for (const file of ['/proc/net/tcp', '/proc/net/tcp6']) {
    let text = '';
    try {
      text = readFileSync(file, 'utf8');
    } catch {
      continue;
    }
    for (const line of text.trim().split('\n').slice(1)) {
      const cols = line.trim().split(/\s+/);
      const [addrHex, portHex] = cols[1].split(':');
      if (cols[3] !== '0A' || parseInt(portHex, 16) !== port) continue; // 0A = LISTEN
      out.push(file.endsWith('6') ? ipv6(addrHex) : ipv4(addrHex));
    }
  }
  return out;
}

function ipv4(hex: string): string {
  // Little-endian bytes: 0100007F → 127.0.0.1
  return [3, 2, 1, 0].map((i) => parseInt(hex.slice(i * 2, i * 2 + 2), 16)).join('.');
}

function ipv6(hex: string): string {
  if (/^0+$/.test(hex)) return '::';
  if (hex === '00000000000000000000000001000000') return '::1';
  if (hex.startsWith('0000000000000000FFFF0000')) return `::ffff:${ipv4(hex.slice(24))}`;
  return hex;
}
