CREATE TYPE "public"."club_activity_kind" AS ENUM('member_joined', 'member_left', 'strain_listed', 'strain_withdrawn', 'strain_requested', 'request_answered', 'handoff_received', 'culture_quarantined');--> statement-breakpoint
CREATE TYPE "public"."strain_request_status" AS ENUM('awaiting_approval', 'open', 'proposed', 'accepted', 'declined', 'received', 'cancelled');--> statement-breakpoint
CREATE TABLE "club_activity" (
	"id" text PRIMARY KEY NOT NULL,
	"club_id" text NOT NULL,
	"actor_user_id" text,
	"kind" "club_activity_kind" NOT NULL,
	"culture_id" text,
	"request_id" text,
	"data" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "club_listings" (
	"id" text PRIMARY KEY NOT NULL,
	"club_id" text NOT NULL,
	"culture_id" text NOT NULL,
	"listed_by_user_id" text NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"withdrawn_at" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "strain_requests" (
	"id" text PRIMARY KEY NOT NULL,
	"club_id" text NOT NULL,
	"listing_id" text NOT NULL,
	"culture_id" text NOT NULL,
	"requester_user_id" text NOT NULL,
	"keeper_user_id" text NOT NULL,
	"message" text DEFAULT '' NOT NULL,
	"needed_by" timestamp with time zone,
	"wanted_form" "culture_form",
	"status" "strain_request_status" NOT NULL,
	"response_note" text DEFAULT '' NOT NULL,
	"proposed_at" timestamp with time zone,
	"received_culture_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "club_activity" ADD CONSTRAINT "club_activity_club_id_clubs_id_fk" FOREIGN KEY ("club_id") REFERENCES "public"."clubs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "club_activity" ADD CONSTRAINT "club_activity_actor_user_id_users_id_fk" FOREIGN KEY ("actor_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "club_activity" ADD CONSTRAINT "club_activity_culture_id_cultures_id_fk" FOREIGN KEY ("culture_id") REFERENCES "public"."cultures"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "club_activity" ADD CONSTRAINT "club_activity_request_id_strain_requests_id_fk" FOREIGN KEY ("request_id") REFERENCES "public"."strain_requests"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "club_listings" ADD CONSTRAINT "club_listings_club_id_clubs_id_fk" FOREIGN KEY ("club_id") REFERENCES "public"."clubs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "club_listings" ADD CONSTRAINT "club_listings_culture_id_cultures_id_fk" FOREIGN KEY ("culture_id") REFERENCES "public"."cultures"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "club_listings" ADD CONSTRAINT "club_listings_listed_by_user_id_users_id_fk" FOREIGN KEY ("listed_by_user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "strain_requests" ADD CONSTRAINT "strain_requests_club_id_clubs_id_fk" FOREIGN KEY ("club_id") REFERENCES "public"."clubs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "strain_requests" ADD CONSTRAINT "strain_requests_listing_id_club_listings_id_fk" FOREIGN KEY ("listing_id") REFERENCES "public"."club_listings"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "strain_requests" ADD CONSTRAINT "strain_requests_culture_id_cultures_id_fk" FOREIGN KEY ("culture_id") REFERENCES "public"."cultures"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "strain_requests" ADD CONSTRAINT "strain_requests_requester_user_id_users_id_fk" FOREIGN KEY ("requester_user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "strain_requests" ADD CONSTRAINT "strain_requests_keeper_user_id_users_id_fk" FOREIGN KEY ("keeper_user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "strain_requests" ADD CONSTRAINT "strain_requests_received_culture_id_cultures_id_fk" FOREIGN KEY ("received_culture_id") REFERENCES "public"."cultures"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "club_activity_club_idx" ON "club_activity" USING btree ("club_id","created_at","id");--> statement-breakpoint
CREATE UNIQUE INDEX "club_listings_live_uq" ON "club_listings" USING btree ("club_id","culture_id") WHERE "club_listings"."withdrawn_at" is null;--> statement-breakpoint
CREATE INDEX "club_listings_club_idx" ON "club_listings" USING btree ("club_id","created_at");--> statement-breakpoint
CREATE INDEX "strain_requests_club_idx" ON "strain_requests" USING btree ("club_id","created_at");--> statement-breakpoint
CREATE INDEX "strain_requests_keeper_idx" ON "strain_requests" USING btree ("keeper_user_id","status");--> statement-breakpoint
CREATE INDEX "strain_requests_requester_idx" ON "strain_requests" USING btree ("requester_user_id","status");