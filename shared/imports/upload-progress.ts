// What an uploader shows while a file goes to the server: the share sent, then, once every byte is sent, that the server
// is checking the rows (the answer comes only after every row is checked and stored).

export interface UploadProgressView {
  /** 0…1 of the bytes sent, or null when the browser cannot tell the total (show an indeterminate bar). */
  ratio: number | null;
  /** "Uploading… 45 % of 1.9 MB" or "Checking 5 000 rows…". */
  text: string;
  /** True once every byte is sent and the server is checking. */
  checking: boolean;
}

/** 1 234 567 bytes → "1.2 MB" (decimal units, as browsers show file sizes); under 1 kB in bytes. */
export function formatBytes(bytes: number): string {
  if (bytes < 1000) return `${bytes} B`;
  if (bytes < 1_000_000) return `${(bytes / 1000).toFixed(bytes < 10_000 ? 1 : 0)} kB`;
  return `${(bytes / 1_000_000).toFixed(1)} MB`;
}

/** 5000 → "5 000" (a space between thousands, as the import messages write counts). */
export function groupDigits(n: number): string {
  return String(n).replace(/\B(?=(\d{3})+(?!\d))/g, ' ');
}

/**
 * The progress of one upload: `sent` of `total` bytes (total 0 = unknown), and the rows the file holds when the
 * browser knows them (null: "the rows"). `what` names the rows ("readings", "points", "rows").
 */
export function uploadProgressView(sent: number, total: number, rows: number | null, what = 'rows'): UploadProgressView {
  const known = total > 0;
  const done = known && sent >= total;
  if (done) {
    const count = rows === null ? `the ${what}` : `${groupDigits(rows)} ${rows === 1 ? what.replace(/s$/, '') : what}`;
    return { ratio: 1, text: `Checking ${count}…`, checking: true };
  }
  if (!known) return { ratio: null, text: sent > 0 ? `Uploading… ${formatBytes(sent)} sent` : 'Uploading…', checking: false };
  const ratio = Math.max(0, Math.min(1, sent / total));
  return { ratio, text: `Uploading… ${Math.floor(ratio * 100)} % of ${formatBytes(total)}`, checking: false };
}
