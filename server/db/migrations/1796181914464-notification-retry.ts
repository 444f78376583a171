import { MigrationInterface, QueryRunner } from "typeorm";

export class NotificationRetry1796181914464 implements MigrationInterface {
    name = 'NotificationRetry1796181914464'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP INDEX \`IDX_258e51e2e4b369023622a30aa7\` ON \`notification\``);
        await queryRunner.query(`ALTER TABLE \`notification\` ADD \`nextAttemptAt\` datetime(3) NULL`);
        await queryRunner.query(`CREATE INDEX \`IDX_7fd1e90e10d42692b18f5f7592\` ON \`notification\` (\`status\`, \`nextAttemptAt\`)`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP INDEX \`IDX_7fd1e90e10d42692b18f5f7592\` ON \`notification\``);
        await queryRunner.query(`ALTER TABLE \`notification\` DROP COLUMN \`nextAttemptAt\``);
        await queryRunner.query(`CREATE INDEX \`IDX_258e51e2e4b369023622a30aa7\` ON \`notification\` (\`status\`, \`createdAt\`)`);
    }

}
