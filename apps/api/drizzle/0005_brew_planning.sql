CREATE TYPE "public"."agitation_without_stir" AS ENUM('shake', 'still');--> statement-breakpoint
CREATE TYPE "public"."plan_purpose" AS ENUM('batch', 'grow');--> statement-breakpoint
CREATE TYPE "public"."plan_status" AS ENUM('planned', 'in_progress', 'pitched', 'cancelled');--> statement-breakpoint
CREATE TABLE "batch_harvests" (
	"batch_id" text NOT NULL,
	"culture_id" text NOT NULL,
	"parent_culture_id" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "batch_harvests_batch_id_culture_id_pk" PRIMARY KEY("batch_id","culture_id")
);
--> statement-breakpoint
CREATE TABLE "batch_pitches" (
	"batch_id" text NOT NULL,
	"culture_id" text NOT NULL,
	"cells_pitched" double precision,
	"generation" integer NOT NULL,
	CONSTRAINT "batch_pitches_batch_id_culture_id_pk" PRIMARY KEY("batch_id","culture_id")
);
--> statement-breakpoint
CREATE TABLE "batches" (
	"id" text PRIMARY KEY NOT NULL,
	"owner_user_id" text NOT NULL,
	"plan_id" text,
	"name" text NOT NULL,
	"brewed_at" timestamp with time zone NOT NULL,
	"volume_l" real NOT NULL,
	"og_sg" real NOT NULL,
	"fg_sg" real,
	"fermentation_temp_c" real,
	"lag_hours" real,
	"notes" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "brewing_equipment" (
	"user_id" text PRIMARY KEY NOT NULL,
	"vessels" jsonb NOT NULL,
	"stir_plate" boolean DEFAULT false NOT NULL,
	"without_stir_plate" "agitation_without_stir" DEFAULT 'shake' NOT NULL,
	"starter_plato" real NOT NULL,
	"max_step_factor" real DEFAULT 10 NOT NULL,
	"cold_crash_hours" integer DEFAULT 24 NOT NULL,
	"growth_correction_opt_in" boolean DEFAULT false NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "brewing_equipment_step_factor" CHECK ("brewing_equipment"."max_step_factor" >= 1 and "brewing_equipment"."max_step_factor" <= 50),
	CONSTRAINT "brewing_equipment_cold_crash" CHECK ("brewing_equipment"."cold_crash_hours" >= 0 and "brewing_equipment"."cold_crash_hours" <= 240)
);
--> statement-breakpoint
CREATE TABLE "starter_plan_steps" (
	"id" text PRIMARY KEY NOT NULL,
	"plan_id" text NOT NULL,
	"position" integer NOT NULL,
	"volume_l" real NOT NULL,
	"plato" real NOT NULL,
	"dme_grams" real NOT NULL,
	"hours" real NOT NULL,
	"start_cells" double precision NOT NULL,
	"start_low" double precision NOT NULL,
	"start_high" double precision NOT NULL,
	"expected_cells" double precision NOT NULL,
	"started_at" timestamp with time zone NOT NULL,
	"completed_at" timestamp with time zone,
	"measured_cells" double precision,
	"measured_low" double precision,
	"measured_high" double precision,
	"count" jsonb,
	"notes" text DEFAULT '' NOT NULL
);
--> statement-breakpoint
CREATE TABLE "starter_plans" (
	"id" text PRIMARY KEY NOT NULL,
	"owner_user_id" text NOT NULL,
	"name" text NOT NULL,
	"purpose" "plan_purpose" NOT NULL,
	"culture_ids" text[] NOT NULL,
	"batch_volume_l" real,
	"og_plato" real,
	"beer_type" text,
	"custom_rate" real,
	"target_cells" double precision,
	"brew_at" timestamp with time zone,
	"equipment" jsonb NOT NULL,
	"growth_correction" real DEFAULT 1 NOT NULL,
	"status" "plan_status" DEFAULT 'planned' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "batch_harvests" ADD CONSTRAINT "batch_harvests_batch_id_batches_id_fk" FOREIGN KEY ("batch_id") REFERENCES "public"."batches"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "batch_harvests" ADD CONSTRAINT "batch_harvests_culture_id_cultures_id_fk" FOREIGN KEY ("culture_id") REFERENCES "public"."cultures"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "batch_harvests" ADD CONSTRAINT "batch_harvests_parent_culture_id_cultures_id_fk" FOREIGN KEY ("parent_culture_id") REFERENCES "public"."cultures"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "batch_pitches" ADD CONSTRAINT "batch_pitches_batch_id_batches_id_fk" FOREIGN KEY ("batch_id") REFERENCES "public"."batches"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "batch_pitches" ADD CONSTRAINT "batch_pitches_culture_id_cultures_id_fk" FOREIGN KEY ("culture_id") REFERENCES "public"."cultures"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "batches" ADD CONSTRAINT "batches_owner_user_id_users_id_fk" FOREIGN KEY ("owner_user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "batches" ADD CONSTRAINT "batches_plan_id_starter_plans_id_fk" FOREIGN KEY ("plan_id") REFERENCES "public"."starter_plans"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "brewing_equipment" ADD CONSTRAINT "brewing_equipment_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "starter_plan_steps" ADD CONSTRAINT "starter_plan_steps_plan_id_starter_plans_id_fk" FOREIGN KEY ("plan_id") REFERENCES "public"."starter_plans"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "starter_plans" ADD CONSTRAINT "starter_plans_owner_user_id_users_id_fk" FOREIGN KEY ("owner_user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "batch_pitches_culture_idx" ON "batch_pitches" USING btree ("culture_id");--> statement-breakpoint
CREATE INDEX "batches_owner_idx" ON "batches" USING btree ("owner_user_id","brewed_at");--> statement-breakpoint
CREATE UNIQUE INDEX "starter_plan_steps_position_idx" ON "starter_plan_steps" USING btree ("plan_id","position");--> statement-breakpoint
CREATE INDEX "starter_plans_owner_idx" ON "starter_plans" USING btree ("owner_user_id","created_at");