import { Migration } from '@mikro-orm/migrations';

/** Users, site settings, workspaces, memberships, chains, revisions and sessions. */
export class Migration20261201220651_initial extends Migration {
  override async up(): Promise<void> {
    this.addSql(
      `create table "site_setting" ("id" int not null, "open_registration" boolean not null default true, "updated_at" timestamptz not null, constraint "site_setting_pkey" primary key ("id"));`,
    );

    this.addSql(
      `create table "app_user" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "email" varchar(254) not null, "display_name" varchar(80) not null, "password_hash" varchar(255) not null, "site_role" text check ("site_role" in ('admin', 'user')) not null default 'user', constraint "app_user_pkey" primary key ("id"));`,
    );
    this.addSql(`alter table "app_user" add constraint "app_user_email_unique" unique ("email");`);

    this.addSql(
      `create table "workspace" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "name" varchar(120) not null, constraint "workspace_pkey" primary key ("id"));`,
    );

    this.addSql(
      `create table "membership" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "user_id" uuid not null, "workspace_id" uuid not null, "role" text check ("role" in ('owner', 'editor', 'viewer')) not null, constraint "membership_pkey" primary key ("id"));`,
    );
    this.addSql(
      `alter table "membership" add constraint "membership_user_id_workspace_id_unique" unique ("user_id", "workspace_id");`,
    );

    this.addSql(
      `create table "chain" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "workspace_id" uuid not null, "name" varchar(200) not null, "description" text not null default '', "f0_hz" double precision not null, "stage_count" int not null, "flag_count" int not null default 0, "document" jsonb not null, "version" int not null default 1, "parent_id" uuid null, "created_by_id" uuid not null, "updated_by_id" uuid not null, constraint "chain_pkey" primary key ("id"));`,
    );
    this.addSql(`create index "chain_workspace_id_index" on "chain" ("workspace_id");`);

    this.addSql(
      `create table "chain_revision" ("id" uuid not null, "chain_id" uuid not null, "version" int not null, "document" jsonb not null, "author_id" uuid not null, "message" varchar(500) not null default '', "created_at" timestamptz not null, constraint "chain_revision_pkey" primary key ("id"));`,
    );
    this.addSql(
      `alter table "chain_revision" add constraint "chain_revision_chain_id_version_unique" unique ("chain_id", "version");`,
    );

    this.addSql(
      `alter table "membership" add constraint "membership_user_id_foreign" foreign key ("user_id") references "app_user" ("id") on update cascade on delete cascade;`,
    );
    this.addSql(
      `alter table "membership" add constraint "membership_workspace_id_foreign" foreign key ("workspace_id") references "workspace" ("id") on update cascade on delete cascade;`,
    );

    this.addSql(
      `alter table "chain" add constraint "chain_workspace_id_foreign" foreign key ("workspace_id") references "workspace" ("id") on update cascade on delete cascade;`,
    );
    this.addSql(
      `alter table "chain" add constraint "chain_parent_id_foreign" foreign key ("parent_id") references "chain" ("id") on update cascade on delete set null;`,
    );
    this.addSql(
      `alter table "chain" add constraint "chain_created_by_id_foreign" foreign key ("created_by_id") references "app_user" ("id") on update cascade on delete restrict;`,
    );
    this.addSql(
      `alter table "chain" add constraint "chain_updated_by_id_foreign" foreign key ("updated_by_id") references "app_user" ("id") on update cascade on delete restrict;`,
    );

    this.addSql(
      `alter table "chain_revision" add constraint "chain_revision_chain_id_foreign" foreign key ("chain_id") references "chain" ("id") on update cascade on delete cascade;`,
    );
    this.addSql(
      `alter table "chain_revision" add constraint "chain_revision_author_id_foreign" foreign key ("author_id") references "app_user" ("id") on update cascade on delete restrict;`,
    );

    // Session store (connect-pg-simple); listed in schemaGenerator.skipTables.
    this.addSql(
      `create table "user_session" ("sid" varchar not null collate "default", "sess" json not null, "expire" timestamp(6) not null, constraint "user_session_pkey" primary key ("sid"));`,
    );
    this.addSql(`create index "user_session_expire_index" on "user_session" ("expire");`);
  }

  override async down(): Promise<void> {
    this.addSql(`drop table if exists "user_session" cascade;`);
    this.addSql(`drop table if exists "chain_revision" cascade;`);
    this.addSql(`drop table if exists "chain" cascade;`);
    this.addSql(`drop table if exists "membership" cascade;`);
    this.addSql(`drop table if exists "workspace" cascade;`);
    this.addSql(`drop table if exists "app_user" cascade;`);
    this.addSql(`drop table if exists "site_setting" cascade;`);
  }
}
