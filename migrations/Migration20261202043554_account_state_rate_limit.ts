import { Migration } from '@mikro-orm/migrations';

/** Sign-in limit counters shared by every server process; account deactivation and deletion. */
export class Migration20261202043554_account_state_rate_limit extends Migration {
  override async up(): Promise<void> {
    this.addSql(
      `create table "rate_limit_hit" ("key" varchar(255) not null, "hits" int not null, "reset_at" timestamptz not null, constraint "rate_limit_hit_pkey" primary key ("key"));`,
    );
    this.addSql(`create index "rate_limit_hit_reset_at_index" on "rate_limit_hit" ("reset_at");`);

    this.addSql(
      `alter table "app_user" add column "deactivated_at" timestamptz null, add column "deleted_at" timestamptz null;`,
    );
  }

  override async down(): Promise<void> {
    this.addSql(`drop table if exists "rate_limit_hit" cascade;`);

    this.addSql(`alter table "app_user" drop column "deactivated_at", drop column "deleted_at";`);
  }
}
