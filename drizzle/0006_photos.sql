CREATE TABLE "photos" (
	"id" uuid PRIMARY KEY NOT NULL,
	"workshop_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"deleted_at" timestamp with time zone,
	"change_number" bigint NOT NULL,
	"build_id" uuid NOT NULL,
	"step_id" uuid,
	"pour_id" uuid,
	"caption" text DEFAULT '' NOT NULL,
	"taken_at" timestamp with time zone,
	"width" integer NOT NULL,
	"height" integer NOT NULL,
	"content_hash" text NOT NULL,
	"display_key" text NOT NULL,
	"display_bytes" integer NOT NULL,
	"thumb_key" text NOT NULL,
	"thumb_bytes" integer NOT NULL,
	"uploaded_by" uuid
);
--> statement-breakpoint
ALTER TABLE "builds" ADD COLUMN "cover_photo_id" uuid;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_workshop_id_workshops_id_fk" FOREIGN KEY ("workshop_id") REFERENCES "public"."workshops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_build_id_builds_id_fk" FOREIGN KEY ("build_id") REFERENCES "public"."builds"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_step_id_build_steps_id_fk" FOREIGN KEY ("step_id") REFERENCES "public"."build_steps"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_pour_id_pours_id_fk" FOREIGN KEY ("pour_id") REFERENCES "public"."pours"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_uploaded_by_users_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "photos_build" ON "photos" USING btree ("build_id");--> statement-breakpoint
CREATE INDEX "photos_workshop_change" ON "photos" USING btree ("workshop_id","change_number");