import { MigrationInterface, QueryRunner } from "typeorm";

export class Init1796178199079 implements MigrationInterface {
    name = 'Init1796178199079'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`app_setting\` (\`key\` varchar(64) NOT NULL, \`value\` text NOT NULL, PRIMARY KEY (\`key\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`audit_entry\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`userId\` int UNSIGNED NULL, \`action\` varchar(40) NOT NULL, \`entity\` varchar(60) NOT NULL, \`entityId\` varchar(60) NOT NULL, \`before\` json NULL, \`after\` json NULL, \`highlighted\` tinyint NOT NULL DEFAULT 0, \`note\` varchar(500) NULL, INDEX \`IDX_9d18bd4a32fc0cd8ff82b12037\` (\`at\`), INDEX \`IDX_2084e450cdb71be32b816bca4e\` (\`entity\`, \`entityId\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`attachment\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`ownerType\` varchar(20) NOT NULL, \`ownerId\` int UNSIGNED NOT NULL, \`name\` varchar(255) NOT NULL, \`contentType\` varchar(100) NOT NULL, \`kind\` varchar(30) NOT NULL, \`size\` int UNSIGNED NOT NULL, \`sha256\` char(64) NOT NULL, \`createdById\` int UNSIGNED NULL, \`createdAt\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`IDX_b7d0b32a24ee6ddf4af5fd184c\` (\`ownerType\`, \`ownerId\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`attachment_content\` (\`attachmentId\` int UNSIGNED NOT NULL, \`data\` longblob NOT NULL, PRIMARY KEY (\`attachmentId\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`criteria_set\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`version\` int UNSIGNED NOT NULL, \`status\` varchar(10) NOT NULL, \`thresholds\` json NOT NULL, \`notes\` text NULL, \`createdById\` int UNSIGNED NULL, \`publishedAt\` datetime(3) NULL, \`createdAt\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), UNIQUE INDEX \`IDX_786b927fa2736a54a67c8fcb04\` (\`version\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`design\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`reference\` varchar(80) NOT NULL, \`maker\` varchar(120) NOT NULL, \`windings\` varchar(20) NOT NULL DEFAULT 'two-winding', \`vectorGroup\` varchar(20) NOT NULL, \`phases\` tinyint UNSIGNED NOT NULL DEFAULT '3', \`hvKV\` double NOT NULL, \`lvKV\` double NOT NULL, \`tvKV\` double NULL, \`coolingStages\` json NOT NULL, \`impedancePercent\` double NOT NULL, \`impedanceBaseKVA\` double NOT NULL, \`conductor\` varchar(2) NOT NULL DEFAULT 'Cu', \`requiredCapacitance\` json NOT NULL, \`notes\` text NULL, \`createdAt\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`updatedAt\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), UNIQUE INDEX \`IDX_457535350cb48ece3d5fbd36f6\` (\`reference\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`site\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`name\` varchar(120) NOT NULL, \`timeZone\` varchar(64) NOT NULL, \`createdAt\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), UNIQUE INDEX \`IDX_9669a09fcc0eb6d2794a658f64\` (\`name\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`unit\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`serial\` varchar(60) NOT NULL, \`position\` varchar(60) NOT NULL DEFAULT '', \`siteId\` int UNSIGNED NOT NULL, \`designId\` int UNSIGNED NOT NULL, \`year\` smallint UNSIGNED NULL, \`phases\` tinyint UNSIGNED NOT NULL, \`hvKV\` double NOT NULL, \`lvKV\` double NOT NULL, \`ratedKVA\` double NOT NULL, \`impedancePercent\` double NOT NULL, \`systemImpedancePercent\` double NOT NULL DEFAULT '0', \`conductor\` varchar(2) NOT NULL DEFAULT 'Cu', \`lastEventAt\` datetime(3) NULL, \`lastEventId\` int UNSIGNED NULL, \`lastEventStatus\` varchar(12) NULL, \`lastRecommendation\` varchar(12) NULL, \`createdAt\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`updatedAt\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), INDEX \`IDX_cc4a543b3aa78631b5f4bc4cc3\` (\`lastRecommendation\`, \`serial\`), INDEX \`IDX_41013d4e5cf8862a8b5d276b55\` (\`lastEventAt\`), INDEX \`IDX_d16b6fc0563a7e7ca1ac1c3074\` (\`designId\`, \`serial\`), INDEX \`IDX_4cf3e88d953cdafaecfb198f12\` (\`siteId\`, \`serial\`), UNIQUE INDEX \`IDX_99481f1f46ea2ed8f30c11cee9\` (\`serial\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`fault_event\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`unitId\` int UNSIGNED NOT NULL, \`occurredAt\` datetime(3) NOT NULL, \`type\` varchar(30) NOT NULL, \`faultedPhases\` varchar(10) NULL, \`side\` varchar(2) NOT NULL, \`shots\` json NOT NULL, \`transformerTripped\` tinyint NOT NULL DEFAULT 1, \`protectionOperated\` json NOT NULL, \`notes\` text NULL, \`status\` varchar(12) NOT NULL DEFAULT 'logged', \`createdById\` int UNSIGNED NULL, \`createdAt\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`updatedAt\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), INDEX \`IDX_3d1a0d300bc88065a9cfd59b3e\` (\`occurredAt\`), INDEX \`IDX_de4c6a35a5486d0f6e5ce5fe7b\` (\`status\`, \`occurredAt\`), INDEX \`IDX_8fd28d09bbe700263860ebfa81\` (\`unitId\`, \`occurredAt\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`notification\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`eventId\` int UNSIGNED NULL, \`screeningId\` int UNSIGNED NULL, \`to\` varchar(254) NOT NULL, \`subject\` varchar(500) NOT NULL, \`status\` varchar(10) NOT NULL DEFAULT 'queued', \`attempts\` int UNSIGNED NOT NULL DEFAULT '0', \`lastError\` text NULL, \`sentAt\` datetime(3) NULL, \`messageId\` varchar(255) NULL, \`createdAt\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`IDX_4d8dd208e427731306a6be66ad\` (\`eventId\`), INDEX \`IDX_258e51e2e4b369023622a30aa7\` (\`status\`, \`createdAt\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`reading_set\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`unitId\` int UNSIGNED NOT NULL, \`kind\` varchar(14) NOT NULL, \`eventId\` int UNSIGNED NULL, \`isReference\` tinyint NOT NULL DEFAULT 0, \`takenAt\` datetime(3) NOT NULL, \`temperatureC\` double NULL, \`topOilC\` double NULL, \`bottomOilC\` double NULL, \`ambientC\` double NULL, \`humidityPercent\` double NULL, \`tapPosition\` varchar(20) NULL, \`instrument\` varchar(120) NULL, \`instrumentSerial\` varchar(60) NULL, \`testKV\` double NULL, \`testFrequencyHz\` double NULL, \`hoursDeenergised\` double NULL, \`extra\` json NULL, \`notes\` text NULL, \`createdById\` int UNSIGNED NULL, \`createdAt\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`IDX_e6dda5b88b31340ec4e145cabd\` (\`eventId\`, \`takenAt\`), INDEX \`IDX_4856af4e502e37fdac63b21344\` (\`unitId\`, \`kind\`, \`takenAt\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`reading\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`readingSetId\` int UNSIGNED NOT NULL, \`quantity\` varchar(30) NOT NULL, \`configuration\` varchar(20) NULL, \`phase\` varchar(8) NULL, \`mode\` varchar(20) NULL, \`frequencyHz\` double NULL, \`value\` double NOT NULL, \`unit\` varchar(12) NOT NULL, INDEX \`IDX_43dbbf52d8c5c758aa9639ca2a\` (\`readingSetId\`, \`quantity\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`sweep_trace\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`readingSetId\` int UNSIGNED NOT NULL, \`label\` varchar(60) NOT NULL, \`testType\` varchar(30) NOT NULL, \`terminals\` varchar(60) NULL, \`tapPosition\` varchar(20) NULL, \`demagnetised\` tinyint NULL, \`points\` json NOT NULL, \`pointCount\` int UNSIGNED NOT NULL, \`minHz\` double NOT NULL, \`maxHz\` double NOT NULL, \`sha256\` char(64) NOT NULL, \`fileName\` varchar(255) NULL, \`createdById\` int UNSIGNED NULL, \`createdAt\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`IDX_effd7aa487a50e9fd27a595c21\` (\`readingSetId\`, \`label\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`screening\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`eventId\` int UNSIGNED NOT NULL, \`case\` json NOT NULL, \`result\` json NOT NULL, \`recommendation\` varchar(12) NOT NULL, \`criteriaVersion\` int UNSIGNED NOT NULL, \`comparison\` tinyint NOT NULL DEFAULT 0, \`computedById\` int UNSIGNED NULL, \`computedAt\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`IDX_44f43bad54b0e710bfd194dbe0\` (\`eventId\`, \`comparison\`, \`computedAt\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`decision\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`screeningId\` int UNSIGNED NOT NULL, \`managerId\` int UNSIGNED NOT NULL, \`outcome\` varchar(30) NOT NULL, \`restrictions\` text NULL, \`reason\` text NOT NULL, \`againstRecommendation\` tinyint NOT NULL DEFAULT 0, \`signedAt\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), UNIQUE INDEX \`IDX_ccbe5b018b00abfecfd27157a2\` (\`screeningId\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`finding\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`eventId\` int UNSIGNED NOT NULL, \`classification\` varchar(30) NOT NULL, \`text\` text NOT NULL, \`recordedById\` int UNSIGNED NULL, \`recordedAt\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`IDX_4f97e8aaee9750db3ee64e08e2\` (\`eventId\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`follow_up\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`eventId\` int UNSIGNED NOT NULL, \`task\` varchar(300) NOT NULL, \`dueAt\` datetime(3) NULL, \`closedAt\` datetime(3) NULL, \`closedById\` int UNSIGNED NULL, \`result\` text NULL, \`createdAt\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`IDX_b77d3b0b53e1a93bbe99a148ba\` (\`eventId\`), INDEX \`IDX_59722b58972a4ce87ad32db942\` (\`closedAt\`, \`dueAt\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`user\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`email\` varchar(254) NOT NULL, \`name\` varchar(120) NOT NULL, \`passwordHash\` varchar(100) NOT NULL, \`roles\` json NOT NULL, \`allSites\` tinyint NOT NULL DEFAULT 0, \`active\` tinyint NOT NULL DEFAULT 1, \`demo\` tinyint NOT NULL DEFAULT 0, \`failedSignIns\` int UNSIGNED NOT NULL DEFAULT '0', \`lockedUntil\` datetime(3) NULL, \`lastSignInAt\` datetime(3) NULL, \`createdAt\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`updatedAt\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), UNIQUE INDEX \`IDX_e12875dfb3b1d92d7d7c5377e2\` (\`email\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`sink_message\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`receivedAt\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`to\` varchar(1000) NOT NULL, \`subject\` varchar(500) NOT NULL, \`text\` mediumtext NOT NULL, \`attachments\` json NOT NULL, PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`user_site\` (\`userId\` int UNSIGNED NOT NULL, \`siteId\` int UNSIGNED NOT NULL, INDEX \`IDX_d9c917797b31cdf1a6cb0b5202\` (\`userId\`), INDEX \`IDX_be4fc79afbed317805f6e3bb4c\` (\`siteId\`), PRIMARY KEY (\`userId\`, \`siteId\`)) ENGINE=InnoDB`);
        await queryRunner.query(`ALTER TABLE \`attachment_content\` ADD CONSTRAINT \`FK_8ee07014f4c576564bb6ddc6cd3\` FOREIGN KEY (\`attachmentId\`) REFERENCES \`attachment\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`);
        await queryRunner.query(`ALTER TABLE \`unit\` ADD CONSTRAINT \`FK_981b24aa1219ee368187eefdac7\` FOREIGN KEY (\`siteId\`) REFERENCES \`site\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`);
        await queryRunner.query(`ALTER TABLE \`unit\` ADD CONSTRAINT \`FK_12ac3330168ed5561619242b5d6\` FOREIGN KEY (\`designId\`) REFERENCES \`design\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`);
        await queryRunner.query(`ALTER TABLE \`fault_event\` ADD CONSTRAINT \`FK_00d3da1c2fedb375d1c87d4a6b0\` FOREIGN KEY (\`unitId\`) REFERENCES \`unit\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`);
        await queryRunner.query(`ALTER TABLE \`reading_set\` ADD CONSTRAINT \`FK_49dc1baa91044f1567abc7b7ed3\` FOREIGN KEY (\`unitId\`) REFERENCES \`unit\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`);
        await queryRunner.query(`ALTER TABLE \`reading_set\` ADD CONSTRAINT \`FK_46efd2da5c8d74705a75f1ab711\` FOREIGN KEY (\`eventId\`) REFERENCES \`fault_event\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`);
        await queryRunner.query(`ALTER TABLE \`reading\` ADD CONSTRAINT \`FK_81d4782f6918b9078a438fb7d13\` FOREIGN KEY (\`readingSetId\`) REFERENCES \`reading_set\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`);
        await queryRunner.query(`ALTER TABLE \`sweep_trace\` ADD CONSTRAINT \`FK_42658b38308d75d3fac616853db\` FOREIGN KEY (\`readingSetId\`) REFERENCES \`reading_set\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`);
        await queryRunner.query(`ALTER TABLE \`screening\` ADD CONSTRAINT \`FK_fa8fcd65dc49d642f408cba93f9\` FOREIGN KEY (\`eventId\`) REFERENCES \`fault_event\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`);
        await queryRunner.query(`ALTER TABLE \`decision\` ADD CONSTRAINT \`FK_ccbe5b018b00abfecfd27157a2d\` FOREIGN KEY (\`screeningId\`) REFERENCES \`screening\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`);
        await queryRunner.query(`ALTER TABLE \`finding\` ADD CONSTRAINT \`FK_4f97e8aaee9750db3ee64e08e2b\` FOREIGN KEY (\`eventId\`) REFERENCES \`fault_event\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`);
        await queryRunner.query(`ALTER TABLE \`follow_up\` ADD CONSTRAINT \`FK_b77d3b0b53e1a93bbe99a148ba4\` FOREIGN KEY (\`eventId\`) REFERENCES \`fault_event\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`);
        await queryRunner.query(`ALTER TABLE \`user_site\` ADD CONSTRAINT \`FK_d9c917797b31cdf1a6cb0b5202a\` FOREIGN KEY (\`userId\`) REFERENCES \`user\`(\`id\`) ON DELETE CASCADE ON UPDATE CASCADE`);
        await queryRunner.query(`ALTER TABLE \`user_site\` ADD CONSTRAINT \`FK_be4fc79afbed317805f6e3bb4cb\` FOREIGN KEY (\`siteId\`) REFERENCES \`site\`(\`id\`) ON DELETE CASCADE ON UPDATE CASCADE`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`ALTER TABLE \`user_site\` DROP FOREIGN KEY \`FK_be4fc79afbed317805f6e3bb4cb\``);
        await queryRunner.query(`ALTER TABLE \`user_site\` DROP FOREIGN KEY \`FK_d9c917797b31cdf1a6cb0b5202a\``);
        await queryRunner.query(`ALTER TABLE \`follow_up\` DROP FOREIGN KEY \`FK_b77d3b0b53e1a93bbe99a148ba4\``);
        await queryRunner.query(`ALTER TABLE \`finding\` DROP FOREIGN KEY \`FK_4f97e8aaee9750db3ee64e08e2b\``);
        await queryRunner.query(`ALTER TABLE \`decision\` DROP FOREIGN KEY \`FK_ccbe5b018b00abfecfd27157a2d\``);
        await queryRunner.query(`ALTER TABLE \`screening\` DROP FOREIGN KEY \`FK_fa8fcd65dc49d642f408cba93f9\``);
        await queryRunner.query(`ALTER TABLE \`sweep_trace\` DROP FOREIGN KEY \`FK_42658b38308d75d3fac616853db\``);
        await queryRunner.query(`ALTER TABLE \`reading\` DROP FOREIGN KEY \`FK_81d4782f6918b9078a438fb7d13\``);
        await queryRunner.query(`ALTER TABLE \`reading_set\` DROP FOREIGN KEY \`FK_46efd2da5c8d74705a75f1ab711\``);
        await queryRunner.query(`ALTER TABLE \`reading_set\` DROP FOREIGN KEY \`FK_49dc1baa91044f1567abc7b7ed3\``);
        await queryRunner.query(`ALTER TABLE \`fault_event\` DROP FOREIGN KEY \`FK_00d3da1c2fedb375d1c87d4a6b0\``);
        await queryRunner.query(`ALTER TABLE \`unit\` DROP FOREIGN KEY \`FK_12ac3330168ed5561619242b5d6\``);
        await queryRunner.query(`ALTER TABLE \`unit\` DROP FOREIGN KEY \`FK_981b24aa1219ee368187eefdac7\``);
        await queryRunner.query(`ALTER TABLE \`attachment_content\` DROP FOREIGN KEY \`FK_8ee07014f4c576564bb6ddc6cd3\``);
        await queryRunner.query(`DROP INDEX \`IDX_be4fc79afbed317805f6e3bb4c\` ON \`user_site\``);
        await queryRunner.query(`DROP INDEX \`IDX_d9c917797b31cdf1a6cb0b5202\` ON \`user_site\``);
        await queryRunner.query(`DROP TABLE \`user_site\``);
        await queryRunner.query(`DROP TABLE \`sink_message\``);
        await queryRunner.query(`DROP INDEX \`IDX_e12875dfb3b1d92d7d7c5377e2\` ON \`user\``);
        await queryRunner.query(`DROP TABLE \`user\``);
        await queryRunner.query(`DROP INDEX \`IDX_59722b58972a4ce87ad32db942\` ON \`follow_up\``);
        await queryRunner.query(`DROP INDEX \`IDX_b77d3b0b53e1a93bbe99a148ba\` ON \`follow_up\``);
        await queryRunner.query(`DROP TABLE \`follow_up\``);
        await queryRunner.query(`DROP INDEX \`IDX_4f97e8aaee9750db3ee64e08e2\` ON \`finding\``);
        await queryRunner.query(`DROP TABLE \`finding\``);
        await queryRunner.query(`DROP INDEX \`IDX_ccbe5b018b00abfecfd27157a2\` ON \`decision\``);
        await queryRunner.query(`DROP TABLE \`decision\``);
        await queryRunner.query(`DROP INDEX \`IDX_44f43bad54b0e710bfd194dbe0\` ON \`screening\``);
        await queryRunner.query(`DROP TABLE \`screening\``);
        await queryRunner.query(`DROP INDEX \`IDX_effd7aa487a50e9fd27a595c21\` ON \`sweep_trace\``);
        await queryRunner.query(`DROP TABLE \`sweep_trace\``);
        await queryRunner.query(`DROP INDEX \`IDX_43dbbf52d8c5c758aa9639ca2a\` ON \`reading\``);
        await queryRunner.query(`DROP TABLE \`reading\``);
        await queryRunner.query(`DROP INDEX \`IDX_4856af4e502e37fdac63b21344\` ON \`reading_set\``);
        await queryRunner.query(`DROP INDEX \`IDX_e6dda5b88b31340ec4e145cabd\` ON \`reading_set\``);
        await queryRunner.query(`DROP TABLE \`reading_set\``);
        await queryRunner.query(`DROP INDEX \`IDX_258e51e2e4b369023622a30aa7\` ON \`notification\``);
        await queryRunner.query(`DROP INDEX \`IDX_4d8dd208e427731306a6be66ad\` ON \`notification\``);
        await queryRunner.query(`DROP TABLE \`notification\``);
        await queryRunner.query(`DROP INDEX \`IDX_8fd28d09bbe700263860ebfa81\` ON \`fault_event\``);
        await queryRunner.query(`DROP INDEX \`IDX_de4c6a35a5486d0f6e5ce5fe7b\` ON \`fault_event\``);
        await queryRunner.query(`DROP INDEX \`IDX_3d1a0d300bc88065a9cfd59b3e\` ON \`fault_event\``);
        await queryRunner.query(`DROP TABLE \`fault_event\``);
        await queryRunner.query(`DROP INDEX \`IDX_99481f1f46ea2ed8f30c11cee9\` ON \`unit\``);
        await queryRunner.query(`DROP INDEX \`IDX_4cf3e88d953cdafaecfb198f12\` ON \`unit\``);
        await queryRunner.query(`DROP INDEX \`IDX_d16b6fc0563a7e7ca1ac1c3074\` ON \`unit\``);
        await queryRunner.query(`DROP INDEX \`IDX_41013d4e5cf8862a8b5d276b55\` ON \`unit\``);
        await queryRunner.query(`DROP INDEX \`IDX_cc4a543b3aa78631b5f4bc4cc3\` ON \`unit\``);
        await queryRunner.query(`DROP TABLE \`unit\``);
        await queryRunner.query(`DROP INDEX \`IDX_9669a09fcc0eb6d2794a658f64\` ON \`site\``);
        await queryRunner.query(`DROP TABLE \`site\``);
        await queryRunner.query(`DROP INDEX \`IDX_457535350cb48ece3d5fbd36f6\` ON \`design\``);
        await queryRunner.query(`DROP TABLE \`design\``);
        await queryRunner.query(`DROP INDEX \`IDX_786b927fa2736a54a67c8fcb04\` ON \`criteria_set\``);
        await queryRunner.query(`DROP TABLE \`criteria_set\``);
        await queryRunner.query(`DROP TABLE \`attachment_content\``);
        await queryRunner.query(`DROP INDEX \`IDX_b7d0b32a24ee6ddf4af5fd184c\` ON \`attachment\``);
        await queryRunner.query(`DROP TABLE \`attachment\``);
        await queryRunner.query(`DROP INDEX \`IDX_2084e450cdb71be32b816bca4e\` ON \`audit_entry\``);
        await queryRunner.query(`DROP INDEX \`IDX_9d18bd4a32fc0cd8ff82b12037\` ON \`audit_entry\``);
        await queryRunner.query(`DROP TABLE \`audit_entry\``);
        await queryRunner.query(`DROP TABLE \`app_setting\``);
    }

}
