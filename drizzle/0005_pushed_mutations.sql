CREATE TABLE "pushed_mutations" (
	"mutation_id" uuid PRIMARY KEY NOT NULL,
	"workshop_id" uuid NOT NULL,
	"user_id" uuid,
	"result" jsonb NOT NULL,
	"received_at" timestamp with time zone DEFAULT now() NOT NULL
);
