CREATE TYPE "public"."email_delivery" AS ENUM('each', 'digest', 'none');--> statement-breakpoint
CREATE TYPE "public"."notification_email_state" AS ENUM('pending', 'sent', 'skipped');--> statement-breakpoint
CREATE TABLE "calendar_feeds" (
	"id" text PRIMARY KEY NOT NULL,
	"user_id" text NOT NULL,
	"token_hash" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"revoked_at" timestamp with time zone,
	"last_used_at" timestamp with time zone,
	CONSTRAINT "calendar_feeds_token_hash_unique" UNIQUE("token_hash")
);
--> statement-breakpoint
CREATE TABLE "notification_digests" (
	"id" text PRIMARY KEY NOT NULL,
	"user_id" text NOT NULL,
	"local_date" date NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"sent_at" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "notification_preferences" (
	"user_id" text PRIMARY KEY NOT NULL,
	"email_delivery" "email_delivery" DEFAULT 'each' NOT NULL,
	"digest_hour" integer DEFAULT 7 NOT NULL,
	"viability_threshold_pct" integer DEFAULT 50 NOT NULL,
	"warn_days" integer DEFAULT 7 NOT NULL,
	"generation_limit" integer DEFAULT 10 NOT NULL,
	"step_lead_hours" integer DEFAULT 12 NOT NULL,
	"muted_kinds" text[] DEFAULT '{}'::text[] NOT NULL,
	"email_token" text NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "notification_preferences_email_token_unique" UNIQUE("email_token"),
	CONSTRAINT "notification_prefs_threshold" CHECK ("notification_preferences"."viability_threshold_pct" between 1 and 99),
	CONSTRAINT "notification_prefs_warn" CHECK ("notification_preferences"."warn_days" between 0 and 60),
	CONSTRAINT "notification_prefs_digest_hour" CHECK ("notification_preferences"."digest_hour" between 0 and 23),
	CONSTRAINT "notification_prefs_generation" CHECK ("notification_preferences"."generation_limit" between 1 and 200),
	CONSTRAINT "notification_prefs_lead" CHECK ("notification_preferences"."step_lead_hours" between 0 and 168)
);
--> statement-breakpoint
CREATE TABLE "notifications" (
	"id" text PRIMARY KEY NOT NULL,
	"user_id" text NOT NULL,
	"kind" text NOT NULL,
	"subject_id" text NOT NULL,
	"dedupe_key" text NOT NULL,
	"title" text NOT NULL,
	"body" text DEFAULT '' NOT NULL,
	"link" text DEFAULT '/' NOT NULL,
	"due_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"read_at" timestamp with time zone,
	"email_state" "notification_email_state" DEFAULT 'pending' NOT NULL,
	"email_claimed_at" timestamp with time zone,
	"emailed_at" timestamp with time zone,
	"digest_id" text
);
--> statement-breakpoint
ALTER TABLE "calendar_feeds" ADD CONSTRAINT "calendar_feeds_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notification_digests" ADD CONSTRAINT "notification_digests_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notification_preferences" ADD CONSTRAINT "notification_preferences_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notifications" ADD CONSTRAINT "notifications_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "calendar_feeds_one_live_uq" ON "calendar_feeds" USING btree ("user_id") WHERE "calendar_feeds"."revoked_at" is null;--> statement-breakpoint
CREATE UNIQUE INDEX "notification_digests_user_date_uq" ON "notification_digests" USING btree ("user_id","local_date");--> statement-breakpoint
CREATE UNIQUE INDEX "notifications_dedupe_uq" ON "notifications" USING btree ("user_id","kind","subject_id","dedupe_key");--> statement-breakpoint
CREATE INDEX "notifications_user_created_idx" ON "notifications" USING btree ("user_id","created_at");--> statement-breakpoint
CREATE INDEX "notifications_user_unread_idx" ON "notifications" USING btree ("user_id") WHERE "notifications"."read_at" is null;--> statement-breakpoint
CREATE INDEX "notifications_email_pending_idx" ON "notifications" USING btree ("user_id") WHERE "notifications"."email_state" = 'pending';