CREATE TABLE "build_steps" (
	"id" uuid PRIMARY KEY NOT NULL,
	"workshop_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"deleted_at" timestamp with time zone,
	"change_number" bigint NOT NULL,
	"build_id" uuid NOT NULL,
	"kind" text NOT NULL,
	"title" text NOT NULL,
	"notes" text DEFAULT '' NOT NULL,
	"happened_at" timestamp with time zone NOT NULL,
	"logged_by" uuid
);
--> statement-breakpoint
CREATE TABLE "builds" (
	"id" uuid PRIMARY KEY NOT NULL,
	"workshop_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"deleted_at" timestamp with time zone,
	"change_number" bigint NOT NULL,
	"name" text NOT NULL,
	"scale_ratio" double precision NOT NULL,
	"scale_id" text,
	"base_width_mm" double precision,
	"base_depth_mm" double precision,
	"real_width_mm" double precision,
	"real_depth_mm" double precision,
	"status" text NOT NULL,
	"notes" text DEFAULT '' NOT NULL,
	"created_by" uuid
);
--> statement-breakpoint
CREATE TABLE "pours" (
	"id" uuid PRIMARY KEY NOT NULL,
	"workshop_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"deleted_at" timestamp with time zone,
	"change_number" bigint NOT NULL,
	"build_id" uuid NOT NULL,
	"step_id" uuid,
	"material_id" uuid NOT NULL,
	"start_at" timestamp with time zone NOT NULL,
	"request" jsonb NOT NULL,
	"plan" jsonb NOT NULL,
	"shortfall" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"logged_by" uuid
);
--> statement-breakpoint
CREATE TABLE "containers" (
	"id" uuid PRIMARY KEY NOT NULL,
	"workshop_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"deleted_at" timestamp with time zone,
	"change_number" bigint NOT NULL,
	"material_id" uuid NOT NULL,
	"part" text NOT NULL,
	"size_qty" double precision NOT NULL,
	"unit" text NOT NULL,
	"price_minor" bigint NOT NULL,
	"currency" text NOT NULL,
	"bought_on" date NOT NULL,
	"opened_on" date,
	"use_by" date,
	"low_stock_qty" double precision,
	"lot" text
);
--> statement-breakpoint
CREATE TABLE "ledger_entries" (
	"id" uuid PRIMARY KEY NOT NULL,
	"workshop_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"deleted_at" timestamp with time zone,
	"change_number" bigint NOT NULL,
	"container_id" uuid NOT NULL,
	"kind" text NOT NULL,
	"quantity" numeric(14, 3) NOT NULL,
	"cost_minor" bigint DEFAULT 0 NOT NULL,
	"at" timestamp with time zone NOT NULL,
	"pour_id" uuid,
	"note" text DEFAULT '' NOT NULL
);
--> statement-breakpoint
CREATE TABLE "materials" (
	"id" uuid PRIMARY KEY NOT NULL,
	"workshop_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"deleted_at" timestamp with time zone,
	"change_number" bigint NOT NULL,
	"name" text NOT NULL,
	"kind" text NOT NULL,
	"data_sheet" jsonb NOT NULL,
	"shelf_life_opened_days" integer,
	"safety_sheet" text DEFAULT '' NOT NULL
);
--> statement-breakpoint
ALTER TABLE "workshops" ADD COLUMN "change_counter" bigint DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "build_steps" ADD CONSTRAINT "build_steps_workshop_id_workshops_id_fk" FOREIGN KEY ("workshop_id") REFERENCES "public"."workshops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "build_steps" ADD CONSTRAINT "build_steps_build_id_builds_id_fk" FOREIGN KEY ("build_id") REFERENCES "public"."builds"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "build_steps" ADD CONSTRAINT "build_steps_logged_by_users_id_fk" FOREIGN KEY ("logged_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "builds" ADD CONSTRAINT "builds_workshop_id_workshops_id_fk" FOREIGN KEY ("workshop_id") REFERENCES "public"."workshops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "builds" ADD CONSTRAINT "builds_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pours" ADD CONSTRAINT "pours_workshop_id_workshops_id_fk" FOREIGN KEY ("workshop_id") REFERENCES "public"."workshops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pours" ADD CONSTRAINT "pours_build_id_builds_id_fk" FOREIGN KEY ("build_id") REFERENCES "public"."builds"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pours" ADD CONSTRAINT "pours_step_id_build_steps_id_fk" FOREIGN KEY ("step_id") REFERENCES "public"."build_steps"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pours" ADD CONSTRAINT "pours_material_id_materials_id_fk" FOREIGN KEY ("material_id") REFERENCES "public"."materials"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pours" ADD CONSTRAINT "pours_logged_by_users_id_fk" FOREIGN KEY ("logged_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "containers" ADD CONSTRAINT "containers_workshop_id_workshops_id_fk" FOREIGN KEY ("workshop_id") REFERENCES "public"."workshops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "containers" ADD CONSTRAINT "containers_material_id_materials_id_fk" FOREIGN KEY ("material_id") REFERENCES "public"."materials"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "ledger_entries" ADD CONSTRAINT "ledger_entries_workshop_id_workshops_id_fk" FOREIGN KEY ("workshop_id") REFERENCES "public"."workshops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "ledger_entries" ADD CONSTRAINT "ledger_entries_container_id_containers_id_fk" FOREIGN KEY ("container_id") REFERENCES "public"."containers"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "materials" ADD CONSTRAINT "materials_workshop_id_workshops_id_fk" FOREIGN KEY ("workshop_id") REFERENCES "public"."workshops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "build_steps_build" ON "build_steps" USING btree ("build_id");--> statement-breakpoint
CREATE INDEX "build_steps_workshop_change" ON "build_steps" USING btree ("workshop_id","change_number");--> statement-breakpoint
CREATE INDEX "builds_workshop_change" ON "builds" USING btree ("workshop_id","change_number");--> statement-breakpoint
CREATE INDEX "pours_build" ON "pours" USING btree ("build_id");--> statement-breakpoint
CREATE INDEX "pours_workshop_change" ON "pours" USING btree ("workshop_id","change_number");--> statement-breakpoint
CREATE INDEX "containers_material" ON "containers" USING btree ("material_id");--> statement-breakpoint
CREATE INDEX "containers_workshop_change" ON "containers" USING btree ("workshop_id","change_number");--> statement-breakpoint
CREATE INDEX "ledger_container" ON "ledger_entries" USING btree ("container_id");--> statement-breakpoint
CREATE INDEX "ledger_pour" ON "ledger_entries" USING btree ("pour_id");--> statement-breakpoint
CREATE INDEX "ledger_workshop_change" ON "ledger_entries" USING btree ("workshop_id","change_number");--> statement-breakpoint
CREATE INDEX "materials_workshop_change" ON "materials" USING btree ("workshop_id","change_number");