ALTER TABLE "cultures" ADD COLUMN "viability_crossing_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "cultures" ADD COLUMN "viability_stale" boolean DEFAULT true NOT NULL;--> statement-breakpoint
ALTER TABLE "cultures" ADD COLUMN "viability_check_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "cultures" ADD COLUMN "storage_check_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "cultures" ADD COLUMN "generation_noticed" boolean DEFAULT false NOT NULL;--> statement-breakpoint
CREATE INDEX "cultures_viability_check_idx" ON "cultures" USING btree ("viability_check_at") WHERE "cultures"."viability_check_at" is not null;--> statement-breakpoint
CREATE INDEX "cultures_storage_check_idx" ON "cultures" USING btree ("storage_check_at") WHERE "cultures"."storage_check_at" is not null and "cultures"."state" in ('active', 'stored');--> statement-breakpoint
CREATE INDEX "cultures_generation_unnoticed_idx" ON "cultures" USING btree ("generation") WHERE not "cultures"."generation_noticed" and "cultures"."state" in ('active', 'stored');--> statement-breakpoint
CREATE INDEX "cultures_best_by_idx" ON "cultures" USING btree ("owner_user_id") WHERE "cultures"."origin" = 'purchased' and "cultures"."form" in ('liquid_pack', 'dry_pack') and "cultures"."origin_details" ? 'bestBy' and "cultures"."state" in ('active', 'stored');--> statement-breakpoint
CREATE INDEX "cultures_viability_stale_idx" ON "cultures" USING btree ("id") WHERE "cultures"."viability_stale";