import { MigrationInterface, QueryRunner } from "typeorm";

export class MustChangePassword1796234400000 implements MigrationInterface {
    name = 'MustChangePassword1796234400000'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`ALTER TABLE \`user\` ADD \`mustChangePassword\` tinyint NOT NULL DEFAULT 0`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`ALTER TABLE \`user\` DROP COLUMN \`mustChangePassword\``);
    }

}
