import { MigrationInterface, QueryRunner } from "typeorm";

export class Init1796177966222 implements MigrationInterface {
    name = 'Init1796177966222'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`app_setting\` (\`key\` varchar(64) NOT NULL, \`value\` text NOT NULL, PRIMARY KEY (\`key\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`audit_entry\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`userId\` int UNSIGNED NULL, \`action\` varchar(40) NOT NULL, \`entity\` varchar(60) NOT NULL, \`entityId\` varchar(60) NOT NULL, \`before\` json NULL, \`after\` json NULL, \`highlighted\` tinyint NOT NULL DEFAULT 0, \`note\` varchar(500) NULL, INDEX \`IDX_9d18bd4a32fc0cd8ff82b12037\` (\`at\`), INDEX \`IDX_2084e450cdb71be32b816bca4e\` (\`entity\`, \`entityId\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`sink_message\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`receivedAt\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`to\` varchar(1000) NOT NULL, \`subject\` varchar(500) NOT NULL, \`text\` mediumtext NOT NULL, \`attachments\` json NOT NULL, PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`site\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`name\` varchar(120) NOT NULL, \`timeZone\` varchar(64) NOT NULL, \`createdAt\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), UNIQUE INDEX \`IDX_9669a09fcc0eb6d2794a658f64\` (\`name\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`user\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`email\` varchar(254) NOT NULL, \`name\` varchar(120) NOT NULL, \`passwordHash\` varchar(100) NOT NULL, \`roles\` json NOT NULL, \`allSites\` tinyint NOT NULL DEFAULT 0, \`active\` tinyint NOT NULL DEFAULT 1, \`demo\` tinyint NOT NULL DEFAULT 0, \`failedSignIns\` int UNSIGNED NOT NULL DEFAULT '0', \`lockedUntil\` datetime(3) NULL, \`lastSignInAt\` datetime(3) NULL, \`createdAt\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`updatedAt\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), UNIQUE INDEX \`IDX_e12875dfb3b1d92d7d7c5377e2\` (\`email\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`user_site\` (\`userId\` int UNSIGNED NOT NULL, \`siteId\` int UNSIGNED NOT NULL, INDEX \`IDX_d9c917797b31cdf1a6cb0b5202\` (\`userId\`), INDEX \`IDX_be4fc79afbed317805f6e3bb4c\` (\`siteId\`), PRIMARY KEY (\`userId\`, \`siteId\`)) ENGINE=InnoDB`);
        await queryRunner.query(`ALTER TABLE \`user_site\` ADD CONSTRAINT \`FK_d9c917797b31cdf1a6cb0b5202a\` FOREIGN KEY (\`userId\`) REFERENCES \`user\`(\`id\`) ON DELETE CASCADE ON UPDATE CASCADE`);
        await queryRunner.query(`ALTER TABLE \`user_site\` ADD CONSTRAINT \`FK_be4fc79afbed317805f6e3bb4cb\` FOREIGN KEY (\`siteId\`) REFERENCES \`site\`(\`id\`) ON DELETE CASCADE ON UPDATE CASCADE`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`ALTER TABLE \`user_site\` DROP FOREIGN KEY \`FK_be4fc79afbed317805f6e3bb4cb\``);
        await queryRunner.query(`ALTER TABLE \`user_site\` DROP FOREIGN KEY \`FK_d9c917797b31cdf1a6cb0b5202a\``);
        await queryRunner.query(`DROP INDEX \`IDX_be4fc79afbed317805f6e3bb4c\` ON \`user_site\``);
        await queryRunner.query(`DROP INDEX \`IDX_d9c917797b31cdf1a6cb0b5202\` ON \`user_site\``);
        await queryRunner.query(`DROP TABLE \`user_site\``);
        await queryRunner.query(`DROP INDEX \`IDX_e12875dfb3b1d92d7d7c5377e2\` ON \`user\``);
        await queryRunner.query(`DROP TABLE \`user\``);
        await queryRunner.query(`DROP INDEX \`IDX_9669a09fcc0eb6d2794a658f64\` ON \`site\``);
        await queryRunner.query(`DROP TABLE \`site\``);
        await queryRunner.query(`DROP TABLE \`sink_message\``);
        await queryRunner.query(`DROP INDEX \`IDX_2084e450cdb71be32b816bca4e\` ON \`audit_entry\``);
        await queryRunner.query(`DROP INDEX \`IDX_9d18bd4a32fc0cd8ff82b12037\` ON \`audit_entry\``);
        await queryRunner.query(`DROP TABLE \`audit_entry\``);
        await queryRunner.query(`DROP TABLE \`app_setting\``);
    }

}
