CREATE TYPE "public"."culture_event_kind" AS ENUM('created', 'harvested', 'fed', 'counted', 'washed', 'moved', 'recultured', 'pitched', 'split', 'sanitation_note', 'observation', 'contamination_suspected', 'contamination_confirmed', 'state_changed', 'note');--> statement-breakpoint
CREATE TYPE "public"."culture_form" AS ENUM('liquid_pack', 'dry_pack', 'slurry_washed', 'slurry_unwashed', 'bottle_dregs', 'slant', 'plate', 'frozen_glycerol');--> statement-breakpoint
CREATE TYPE "public"."culture_origin" AS ENUM('bottle_dregs', 'purchased', 'batch_slurry', 'gift', 'reculture');--> statement-breakpoint
CREATE TYPE "public"."culture_state" AS ENUM('active', 'stored', 'pitched', 'used_up', 'discarded', 'quarantined');--> statement-breakpoint
CREATE TYPE "public"."culture_visibility" AS ENUM('private', 'club');--> statement-breakpoint
CREATE TABLE "culture_events" (
	"id" text PRIMARY KEY NOT NULL,
	"culture_id" text NOT NULL,
	"author_user_id" text,
	"kind" "culture_event_kind" NOT NULL,
	"occurred_at" timestamp with time zone NOT NULL,
	"recorded_at" timestamp with time zone DEFAULT now() NOT NULL,
	"notes" text DEFAULT '' NOT NULL,
	"data" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"supersedes_event_id" text
);
--> statement-breakpoint
CREATE TABLE "culture_photos" (
	"id" text PRIMARY KEY NOT NULL,
	"culture_id" text NOT NULL,
	"event_id" text,
	"uploaded_by" text,
	"caption" text DEFAULT '' NOT NULL,
	"web_key" text NOT NULL,
	"thumb_key" text NOT NULL,
	"content_type" text NOT NULL,
	"width" integer NOT NULL,
	"height" integer NOT NULL,
	"bytes" integer NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "cultures" (
	"id" text PRIMARY KEY NOT NULL,
	"owner_user_id" text NOT NULL,
	"owner_club_id" text,
	"visibility" "culture_visibility" DEFAULT 'private' NOT NULL,
	"parent_id" text,
	"generation" integer DEFAULT 0 NOT NULL,
	"strain_name" text NOT NULL,
	"species" text,
	"tags" text[] DEFAULT '{}'::text[] NOT NULL,
	"origin" "culture_origin" NOT NULL,
	"origin_details" jsonb NOT NULL,
	"form" "culture_form" NOT NULL,
	"amount" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"location_label" text DEFAULT '' NOT NULL,
	"storage_temp_c" real NOT NULL,
	"made_at" timestamp with time zone NOT NULL,
	"state" "culture_state" DEFAULT 'stored' NOT NULL,
	"state_changed_at" timestamp with time zone DEFAULT now() NOT NULL,
	"state_changed_by" text,
	"measured_at" timestamp with time zone,
	"measured_viability" real,
	"measured_cells_per_ml" real,
	"attention_due_at" timestamp with time zone,
	"suspect" boolean DEFAULT false NOT NULL,
	"suspect_from_culture_id" text,
	"suspect_since" timestamp with time zone,
	"notes" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "cultures_not_own_parent" CHECK ("cultures"."parent_id" is null or "cultures"."parent_id" <> "cultures"."id"),
	CONSTRAINT "cultures_generation_range" CHECK ("cultures"."generation" >= 0 and "cultures"."generation" <= 1000)
);
--> statement-breakpoint
ALTER TABLE "culture_events" ADD CONSTRAINT "culture_events_culture_id_cultures_id_fk" FOREIGN KEY ("culture_id") REFERENCES "public"."cultures"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "culture_events" ADD CONSTRAINT "culture_events_author_user_id_users_id_fk" FOREIGN KEY ("author_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "culture_events" ADD CONSTRAINT "culture_events_supersedes_event_id_culture_events_id_fk" FOREIGN KEY ("supersedes_event_id") REFERENCES "public"."culture_events"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "culture_photos" ADD CONSTRAINT "culture_photos_culture_id_cultures_id_fk" FOREIGN KEY ("culture_id") REFERENCES "public"."cultures"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "culture_photos" ADD CONSTRAINT "culture_photos_event_id_culture_events_id_fk" FOREIGN KEY ("event_id") REFERENCES "public"."culture_events"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "culture_photos" ADD CONSTRAINT "culture_photos_uploaded_by_users_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cultures" ADD CONSTRAINT "cultures_owner_user_id_users_id_fk" FOREIGN KEY ("owner_user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cultures" ADD CONSTRAINT "cultures_owner_club_id_clubs_id_fk" FOREIGN KEY ("owner_club_id") REFERENCES "public"."clubs"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cultures" ADD CONSTRAINT "cultures_parent_id_cultures_id_fk" FOREIGN KEY ("parent_id") REFERENCES "public"."cultures"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cultures" ADD CONSTRAINT "cultures_state_changed_by_users_id_fk" FOREIGN KEY ("state_changed_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cultures" ADD CONSTRAINT "cultures_suspect_from_culture_id_cultures_id_fk" FOREIGN KEY ("suspect_from_culture_id") REFERENCES "public"."cultures"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "culture_events_culture_idx" ON "culture_events" USING btree ("culture_id","occurred_at");--> statement-breakpoint
CREATE INDEX "culture_events_supersedes_idx" ON "culture_events" USING btree ("supersedes_event_id");--> statement-breakpoint
CREATE INDEX "culture_photos_culture_idx" ON "culture_photos" USING btree ("culture_id","created_at");--> statement-breakpoint
CREATE INDEX "cultures_owner_attention_idx" ON "cultures" USING btree ("owner_user_id","attention_due_at","id");--> statement-breakpoint
CREATE INDEX "cultures_owner_club_idx" ON "cultures" USING btree ("owner_club_id");--> statement-breakpoint
CREATE INDEX "cultures_parent_idx" ON "cultures" USING btree ("parent_id");