import { verifyAuditChain } from '../common/audit.js';
import { loadConfig } from '../config.js';
import { createDataSource } from '../db/create-data-source.js';

// npm run audit:verify — walks the audit trail's hash chain in id order (as the app account: it only reads).
// Prints "audit trail intact: N entries" and exits 0, or names the first broken entry and why and exits 1.

async function main(): Promise<number> {
  const db = createDataSource(loadConfig());
  await db.initialize();
  try {
    const r = await verifyAuditChain(db.manager);
    if (r.intact) {
      console.log(`audit trail intact: ${r.entries} entries`);
      return 0;
    }
    console.error(`audit trail broken at entry ${r.broken.id} (${r.broken.kind}): ${r.broken.message}`);
    console.error(`${r.entries} entries before it verified.`);
    return 1;
  } finally {
    await db.destroy();
  }
}

main().then(
  (code) => process.exit(code),
  (err) => {
    console.error(`audit:verify could not run: ${err instanceof Error ? err.message : String(err)}`);
    process.exit(2);
  },
);
