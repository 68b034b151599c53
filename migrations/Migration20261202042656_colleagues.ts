import { Migration } from '@mikro-orm/migrations';

/** Working with colleagues: mail outbox, invitations, password resets, address confirmation, read-only links, comments, activity and presence. */
export class Migration20261202042656_colleagues extends Migration {
  override async up(): Promise<void> {
    this.addSql(
      `create table "mail_outbox" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "recipient" varchar(254) not null, "subject" varchar(300) not null, "text" text null, "html" text null, "state" text check ("state" in ('pending', 'sent', 'failed')) not null default 'pending', "attempts" int not null default 0, "last_error" varchar(500) null, "next_attempt_at" timestamptz null, "sent_at" timestamptz null, constraint "mail_outbox_pkey" primary key ("id"));`,
    );
    this.addSql(`create index "mail_outbox_state_index" on "mail_outbox" ("state");`);

    this.addSql(
      `create table "pending_registration" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "email" varchar(254) not null, "display_name" varchar(80) not null, "password_hash" varchar(255) not null, "token_hash" varchar(64) not null, "expires_at" timestamptz not null, constraint "pending_registration_pkey" primary key ("id"));`,
    );
    this.addSql(
      `create index "pending_registration_email_index" on "pending_registration" ("email");`,
    );
    this.addSql(
      `alter table "pending_registration" add constraint "pending_registration_token_hash_unique" unique ("token_hash");`,
    );

    this.addSql(
      `create table "password_reset" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "user_id" uuid not null, "token_hash" varchar(64) not null, "expires_at" timestamptz not null, "used_at" timestamptz null, constraint "password_reset_pkey" primary key ("id"));`,
    );
    this.addSql(`create index "password_reset_user_id_index" on "password_reset" ("user_id");`);
    this.addSql(
      `alter table "password_reset" add constraint "password_reset_token_hash_unique" unique ("token_hash");`,
    );

    this.addSql(
      `create table "invitation" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "workspace_id" uuid not null, "email" varchar(254) not null, "role" text check ("role" in ('owner', 'editor', 'viewer')) not null, "token_hash" varchar(64) not null, "invited_by_id" uuid not null, "expires_at" timestamptz not null, "accepted_at" timestamptz null, "revoked_at" timestamptz null, constraint "invitation_pkey" primary key ("id"));`,
    );
    this.addSql(`create index "invitation_workspace_id_index" on "invitation" ("workspace_id");`);
    this.addSql(
      `alter table "invitation" add constraint "invitation_token_hash_unique" unique ("token_hash");`,
    );

    this.addSql(
      `create table "share_link" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "chain_id" uuid not null, "token_hash" varchar(64) not null, "created_by_id" uuid not null, "expires_at" timestamptz null, "revoked_at" timestamptz null, constraint "share_link_pkey" primary key ("id"));`,
    );
    this.addSql(`create index "share_link_chain_id_index" on "share_link" ("chain_id");`);
    this.addSql(
      `alter table "share_link" add constraint "share_link_token_hash_unique" unique ("token_hash");`,
    );

    this.addSql(
      `create table "chain_presence" ("id" uuid not null, "chain_id" uuid not null, "user_id" uuid not null, "seen_at" timestamptz not null, constraint "chain_presence_pkey" primary key ("id"));`,
    );
    this.addSql(`create index "chain_presence_chain_id_index" on "chain_presence" ("chain_id");`);

    this.addSql(
      `create table "chain_comment" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "chain_id" uuid not null, "stage_id" varchar(64) null, "author_id" uuid not null, "body" text not null, "edited_at" timestamptz null, constraint "chain_comment_pkey" primary key ("id"));`,
    );
    this.addSql(`create index "chain_comment_chain_id_index" on "chain_comment" ("chain_id");`);

    this.addSql(
      `create table "activity" ("id" uuid not null, "workspace_id" uuid not null, "actor_id" uuid not null, "kind" text check ("kind" in ('chain-created', 'chain-saved', 'chain-restored', 'chain-deleted', 'chain-shared', 'chain-sent', 'comment-added', 'member-invited', 'member-joined')) not null, "summary" varchar(500) not null, "chain_id" uuid null, "created_at" timestamptz not null, constraint "activity_pkey" primary key ("id"));`,
    );
    this.addSql(
      `create index "activity_workspace_id_created_at_index" on "activity" ("workspace_id", "created_at");`,
    );

    this.addSql(
      `alter table "password_reset" add constraint "password_reset_user_id_foreign" foreign key ("user_id") references "app_user" ("id") on update cascade on delete cascade;`,
    );

    this.addSql(
      `alter table "invitation" add constraint "invitation_workspace_id_foreign" foreign key ("workspace_id") references "workspace" ("id") on update cascade on delete cascade;`,
    );
    this.addSql(
      `alter table "invitation" add constraint "invitation_invited_by_id_foreign" foreign key ("invited_by_id") references "app_user" ("id") on update cascade on delete cascade;`,
    );

    this.addSql(
      `alter table "share_link" add constraint "share_link_chain_id_foreign" foreign key ("chain_id") references "chain" ("id") on update cascade on delete cascade;`,
    );
    this.addSql(
      `alter table "share_link" add constraint "share_link_created_by_id_foreign" foreign key ("created_by_id") references "app_user" ("id") on update cascade on delete cascade;`,
    );

    this.addSql(
      `alter table "chain_presence" add constraint "chain_presence_chain_id_foreign" foreign key ("chain_id") references "chain" ("id") on update cascade on delete cascade;`,
    );
    this.addSql(
      `alter table "chain_presence" add constraint "chain_presence_user_id_foreign" foreign key ("user_id") references "app_user" ("id") on update cascade on delete cascade;`,
    );

    this.addSql(
      `alter table "chain_comment" add constraint "chain_comment_chain_id_foreign" foreign key ("chain_id") references "chain" ("id") on update cascade on delete cascade;`,
    );
    this.addSql(
      `alter table "chain_comment" add constraint "chain_comment_author_id_foreign" foreign key ("author_id") references "app_user" ("id") on update cascade on delete cascade;`,
    );

    this.addSql(
      `alter table "activity" add constraint "activity_workspace_id_foreign" foreign key ("workspace_id") references "workspace" ("id") on update cascade on delete cascade;`,
    );
    this.addSql(
      `alter table "activity" add constraint "activity_actor_id_foreign" foreign key ("actor_id") references "app_user" ("id") on update cascade on delete cascade;`,
    );
  }

  override async down(): Promise<void> {
    this.addSql(`drop table if exists "mail_outbox" cascade;`);

    this.addSql(`drop table if exists "pending_registration" cascade;`);

    this.addSql(`drop table if exists "password_reset" cascade;`);

    this.addSql(`drop table if exists "invitation" cascade;`);

    this.addSql(`drop table if exists "share_link" cascade;`);

    this.addSql(`drop table if exists "chain_presence" cascade;`);

    this.addSql(`drop table if exists "chain_comment" cascade;`);

    this.addSql(`drop table if exists "activity" cascade;`);
  }
}
