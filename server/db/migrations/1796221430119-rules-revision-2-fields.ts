import { MigrationInterface, QueryRunner } from "typeorm";

export class RulesRevision2Fields1796221430119 implements MigrationInterface {
    name = 'RulesRevision2Fields1796221430119'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`ALTER TABLE \`fault_event\` ADD \`location\` varchar(2) NULL`);
        await queryRunner.query(`ALTER TABLE \`fault_event\` ADD \`currentIs\` varchar(8) NULL`);
        await queryRunner.query(`ALTER TABLE \`reading_set\` ADD \`demagnetised\` tinyint NULL`);
        await queryRunner.query(`ALTER TABLE \`reading_set\` ADD \`windingTemperatureC\` double NULL`);
        await queryRunner.query(`ALTER TABLE \`sweep_trace\` ADD \`winding\` varchar(2) NULL`);
        await queryRunner.query(`ALTER TABLE \`sweep_trace\` ADD \`phase\` varchar(1) NULL`);
        await queryRunner.query(`ALTER TABLE \`sweep_trace\` ADD \`baselineTapPosition\` varchar(20) NULL`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`ALTER TABLE \`sweep_trace\` DROP COLUMN \`baselineTapPosition\``);
        await queryRunner.query(`ALTER TABLE \`sweep_trace\` DROP COLUMN \`phase\``);
        await queryRunner.query(`ALTER TABLE \`sweep_trace\` DROP COLUMN \`winding\``);
        await queryRunner.query(`ALTER TABLE \`reading_set\` DROP COLUMN \`windingTemperatureC\``);
        await queryRunner.query(`ALTER TABLE \`reading_set\` DROP COLUMN \`demagnetised\``);
        await queryRunner.query(`ALTER TABLE \`fault_event\` DROP COLUMN \`currentIs\``);
        await queryRunner.query(`ALTER TABLE \`fault_event\` DROP COLUMN \`location\``);
    }

}
