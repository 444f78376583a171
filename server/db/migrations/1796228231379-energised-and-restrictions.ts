import { MigrationInterface, QueryRunner } from "typeorm";

export class EnergisedAndRestrictions1796228231379 implements MigrationInterface {
    name = 'EnergisedAndRestrictions1796228231379'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`ALTER TABLE \`fault_event\` ADD \`energisedAt\` datetime(3) NULL`);
        await queryRunner.query(`ALTER TABLE \`decision\` ADD \`restrictionsLiftedAt\` datetime(3) NULL`);
        await queryRunner.query(`ALTER TABLE \`decision\` ADD \`restrictionsLiftedById\` int UNSIGNED NULL`);
        await queryRunner.query(`ALTER TABLE \`decision\` ADD \`restrictionsLiftReason\` text NULL`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`ALTER TABLE \`decision\` DROP COLUMN \`restrictionsLiftReason\``);
        await queryRunner.query(`ALTER TABLE \`decision\` DROP COLUMN \`restrictionsLiftedById\``);
        await queryRunner.query(`ALTER TABLE \`decision\` DROP COLUMN \`restrictionsLiftedAt\``);
        await queryRunner.query(`ALTER TABLE \`fault_event\` DROP COLUMN \`energisedAt\``);
    }

}
