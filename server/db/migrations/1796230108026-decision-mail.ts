import { MigrationInterface, QueryRunner } from "typeorm";

export class DecisionMail1796230108026 implements MigrationInterface {
    name = 'DecisionMail1796230108026'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`sink_attachment\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`messageId\` int UNSIGNED NOT NULL, \`position\` int UNSIGNED NOT NULL, \`content\` mediumblob NOT NULL, UNIQUE INDEX \`IDX_8f571272cb89043a10f58d50c2\` (\`messageId\`, \`position\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`ALTER TABLE \`site\` ADD \`controlRoomEmail\` varchar(254) NULL`);
        await queryRunner.query(`ALTER TABLE \`notification\` ADD \`kind\` varchar(12) NOT NULL DEFAULT 'screening'`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`ALTER TABLE \`notification\` DROP COLUMN \`kind\``);
        await queryRunner.query(`ALTER TABLE \`site\` DROP COLUMN \`controlRoomEmail\``);
        await queryRunner.query(`DROP INDEX \`IDX_8f571272cb89043a10f58d50c2\` ON \`sink_attachment\``);
        await queryRunner.query(`DROP TABLE \`sink_attachment\``);
    }

}
