-- Costs kept exact to the millionth of a minor unit, rounded once per line of a report; whole-cent
-- values written before convert as they are, so every existing entry and total keeps its cost.
ALTER TABLE "ledger_entries" ALTER COLUMN "cost_minor" SET DATA TYPE numeric(20, 6);--> statement-breakpoint
ALTER TABLE "cost_totals" ALTER COLUMN "cost_minor" SET DATA TYPE numeric(24, 6);