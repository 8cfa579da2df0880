CREATE TYPE "public"."club_stock_unit" AS ENUM('vial', 'slant', 'plate', 'pack');--> statement-breakpoint
ALTER TYPE "public"."club_activity_kind" ADD VALUE 'stock_added';--> statement-breakpoint
ALTER TYPE "public"."club_activity_kind" ADD VALUE 'stock_withdrawn';--> statement-breakpoint
CREATE TABLE "club_stock" (
	"culture_id" text PRIMARY KEY NOT NULL,
	"club_id" text NOT NULL,
	"unit" "club_stock_unit" NOT NULL,
	"units_left" integer NOT NULL,
	"added_by_user_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "club_stock_units_range" CHECK ("club_stock"."units_left" >= 0 and "club_stock"."units_left" <= 10000)
);
--> statement-breakpoint
ALTER TABLE "club_stock" ADD CONSTRAINT "club_stock_culture_id_cultures_id_fk" FOREIGN KEY ("culture_id") REFERENCES "public"."cultures"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "club_stock" ADD CONSTRAINT "club_stock_club_id_clubs_id_fk" FOREIGN KEY ("club_id") REFERENCES "public"."clubs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "club_stock" ADD CONSTRAINT "club_stock_added_by_user_id_users_id_fk" FOREIGN KEY ("added_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "club_stock_club_idx" ON "club_stock" USING btree ("club_id");