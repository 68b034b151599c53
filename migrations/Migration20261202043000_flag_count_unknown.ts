import { Migration } from '@mikro-orm/migrations';

/** A chain's flag count may be null: unknown, when the chain could not be analysed at its save. */
export class Migration20261202043000_flag_count_unknown extends Migration {
  override async up(): Promise<void> {
    this.addSql(`alter table "chain" alter column "flag_count" drop default;`);
    this.addSql(`alter table "chain" alter column "flag_count" drop not null;`);
  }

  override async down(): Promise<void> {
    this.addSql(`update "chain" set "flag_count" = 0 where "flag_count" is null;`);
    this.addSql(`alter table "chain" alter column "flag_count" set default 0;`);
    this.addSql(`alter table "chain" alter column "flag_count" set not null;`);
  }
}
