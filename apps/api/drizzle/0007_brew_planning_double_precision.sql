ALTER TABLE "batches" ALTER COLUMN "volume_l" SET DATA TYPE double precision;--> statement-breakpoint
ALTER TABLE "batches" ALTER COLUMN "og_sg" SET DATA TYPE double precision;--> statement-breakpoint
ALTER TABLE "batches" ALTER COLUMN "fg_sg" SET DATA TYPE double precision;--> statement-breakpoint
ALTER TABLE "batches" ALTER COLUMN "fermentation_temp_c" SET DATA TYPE double precision;--> statement-breakpoint
ALTER TABLE "batches" ALTER COLUMN "lag_hours" SET DATA TYPE double precision;--> statement-breakpoint
ALTER TABLE "starter_plan_steps" ALTER COLUMN "volume_l" SET DATA TYPE double precision;--> statement-breakpoint
ALTER TABLE "starter_plan_steps" ALTER COLUMN "plato" SET DATA TYPE double precision;--> statement-breakpoint
ALTER TABLE "starter_plan_steps" ALTER COLUMN "dme_grams" SET DATA TYPE double precision;--> statement-breakpoint
ALTER TABLE "starter_plan_steps" ALTER COLUMN "hours" SET DATA TYPE double precision;--> statement-breakpoint
ALTER TABLE "starter_plans" ALTER COLUMN "batch_volume_l" SET DATA TYPE double precision;--> statement-breakpoint
ALTER TABLE "starter_plans" ALTER COLUMN "og_plato" SET DATA TYPE double precision;--> statement-breakpoint
ALTER TABLE "starter_plans" ALTER COLUMN "custom_rate" SET DATA TYPE double precision;--> statement-breakpoint
ALTER TABLE "starter_plans" ALTER COLUMN "growth_correction" SET DATA TYPE double precision;--> statement-breakpoint
ALTER TABLE "starter_plans" ALTER COLUMN "growth_correction" SET DEFAULT 1;