CREATE TABLE "container_stock" (
	"container_id" uuid PRIMARY KEY NOT NULL,
	"workshop_id" uuid NOT NULL,
	"remaining" numeric(16, 3) NOT NULL
);
--> statement-breakpoint
CREATE TABLE "cost_totals" (
	"workshop_id" uuid NOT NULL,
	"build_id" uuid NOT NULL,
	"material_id" uuid NOT NULL,
	"month" date NOT NULL,
	"currency" text NOT NULL,
	"cost_minor" bigint NOT NULL,
	CONSTRAINT "cost_totals_workshop_id_build_id_material_id_month_currency_pk" PRIMARY KEY("workshop_id","build_id","material_id","month","currency")
);
