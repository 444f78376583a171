import { MigrationInterface, QueryRunner } from 'typeorm';
import { GENESIS_HASH } from '../../../shared/audit-chain.js';
import { AUDIT_CHAIN_COLUMNS, auditEntryHash, factsFromRaw, type RawAuditRow } from '../../common/audit-hash.js';

// The audit trail as a hash chain: every entry carries the hash of the entry before it and its own hash; existing
// entries are chained in id order. `audit_chain_head` (one row) holds the newest entry's id and hash: audit() locks it
// to take the next id and the previous hash, so two transactions never chain to the same entry.
export class AuditChain1796420000000 implements MigrationInterface {
  name = 'AuditChain1796420000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE `audit_entry` ADD `prevHash` char(64) NULL, ADD `hash` char(64) NULL');
    await queryRunner.query(
      'CREATE TABLE `audit_chain_head` (`id` tinyint UNSIGNED NOT NULL, `lastId` int UNSIGNED NOT NULL DEFAULT 0, `lastHash` char(64) NOT NULL, PRIMARY KEY (`id`)) ENGINE=InnoDB',
    );
    let prevHash = GENESIS_HASH;
    let lastId = 0;
    for (;;) {
      const rows: RawAuditRow[] = await queryRunner.query(`SELECT ${AUDIT_CHAIN_COLUMNS} FROM \`audit_entry\` WHERE \`id\` > ? ORDER BY \`id\` LIMIT 500`, [lastId]);
      if (!rows.length) break;
      for (const r of rows) {
        const hash = auditEntryHash(factsFromRaw(r), prevHash);
        await queryRunner.query('UPDATE `audit_entry` SET `prevHash` = ?, `hash` = ? WHERE `id` = ?', [prevHash, hash, r.id]);
        prevHash = hash;
        lastId = Number(r.id);
      }
    }
    await queryRunner.query('INSERT INTO `audit_chain_head` (`id`, `lastId`, `lastHash`) VALUES (1, ?, ?)', [lastId, prevHash]);
    await queryRunner.query('ALTER TABLE `audit_entry` MODIFY `prevHash` char(64) NOT NULL, MODIFY `hash` char(64) NOT NULL');
    await queryRunner.query('CREATE UNIQUE INDEX `UQ_audit_entry_prevHash` ON `audit_entry` (`prevHash`)');
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP INDEX `UQ_audit_entry_prevHash` ON `audit_entry`');
    await queryRunner.query('DROP TABLE `audit_chain_head`');
    await queryRunner.query('ALTER TABLE `audit_entry` DROP COLUMN `hash`, DROP COLUMN `prevHash`');
  }
}
