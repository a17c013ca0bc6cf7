CREATE TABLE "pour_layers" (
	"id" uuid PRIMARY KEY NOT NULL,
	"workshop_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"deleted_at" timestamp with time zone,
	"change_number" bigint NOT NULL,
	"pour_id" uuid NOT NULL,
	"number" integer NOT NULL,
	"poured_at" timestamp with time zone NOT NULL,
	"room_temp_c" double precision NOT NULL,
	"depth_mm" double precision NOT NULL,
	"part_a_g" double precision NOT NULL,
	"part_b_g" double precision NOT NULL,
	"weighed_a_g" double precision,
	"weighed_b_g" double precision,
	"note" text DEFAULT '' NOT NULL,
	"recorded_by" uuid
);
--> statement-breakpoint
ALTER TABLE "pours" ADD COLUMN "layer_count" integer;--> statement-breakpoint
UPDATE "pours" SET "layer_count" = ("plan"->'layers'->>'count')::integer;--> statement-breakpoint
ALTER TABLE "pours" ALTER COLUMN "layer_count" SET NOT NULL;--> statement-breakpoint
ALTER TABLE "pours" ADD COLUMN "chosen_container_ids" jsonb;--> statement-breakpoint
ALTER TABLE "reminder_preferences" ADD COLUMN "recoat_lead_min" integer DEFAULT 30 NOT NULL;--> statement-breakpoint
ALTER TABLE "pour_layers" ADD CONSTRAINT "pour_layers_workshop_id_workshops_id_fk" FOREIGN KEY ("workshop_id") REFERENCES "public"."workshops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pour_layers" ADD CONSTRAINT "pour_layers_pour_id_pours_id_fk" FOREIGN KEY ("pour_id") REFERENCES "public"."pours"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pour_layers" ADD CONSTRAINT "pour_layers_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "pour_layers_pour_number" ON "pour_layers" USING btree ("pour_id","number") WHERE deleted_at IS NULL;--> statement-breakpoint
CREATE INDEX "pour_layers_workshop_change" ON "pour_layers" USING btree ("workshop_id","change_number");--> statement-breakpoint
INSERT INTO "pour_layers" ("id", "workshop_id", "created_at", "updated_at", "deleted_at", "change_number", "pour_id", "number", "poured_at", "room_temp_c", "depth_mm", "part_a_g", "part_b_g", "recorded_by")
SELECT "id", "workshop_id", "created_at", "updated_at", "deleted_at", "change_number", "id", 1, "start_at",
  ("request"->>'roomTempC')::double precision,
  ("plan"->'layers'->>'layerDepthMm')::double precision,
  ("plan"->'mix'->'perLayer'->>'partAG')::double precision,
  ("plan"->'mix'->'perLayer'->>'partBG')::double precision,
  "logged_by"
FROM "pours";--> statement-breakpoint
UPDATE "reminder_preferences" SET "kinds" = array_append("kinds", 'recoat-window-closes')
WHERE 'next-layer-due' = ANY("kinds") AND NOT ('recoat-window-closes' = ANY("kinds"));