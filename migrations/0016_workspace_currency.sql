ALTER TABLE "settings" ADD CONSTRAINT "settings_currency_code" CHECK ("settings"."key" <> 'currency' OR (jsonb_typeof("settings"."value") = 'string' AND "settings"."value" #>> '{}' ~ '^[A-Z]{3}$'));--> statement-breakpoint
-- The workspace currency starts as USD; an admin changes it (PUT /api/budgets/currency, audited).
INSERT INTO "settings" ("key", "value") VALUES ('currency', '"USD"'::jsonb) ON CONFLICT ("key") DO NOTHING;
