-- The shelf holds what is not poured too: foam, plaster, paint, figures, track, glue. Those have no data sheet
-- and say how they are measured; every existing material keeps its data sheet and is measured as before.
ALTER TABLE "materials" ALTER COLUMN "data_sheet" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "materials" ADD COLUMN IF NOT EXISTS "measure" text;