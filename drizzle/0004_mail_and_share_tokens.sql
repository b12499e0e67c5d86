ALTER TABLE "outbox" ADD COLUMN "team_id" text;--> statement-breakpoint
ALTER TABLE "share_links" ADD COLUMN "token_hash" text;--> statement-breakpoint
-- Existing links keep working: their token (the old id) is stored as its sha-256, and the row gets a new id.
UPDATE "share_links" SET "token_hash" = encode(sha256(convert_to("id", 'UTF8')), 'hex'), "id" = gen_random_uuid()::text;--> statement-breakpoint
ALTER TABLE "share_links" ALTER COLUMN "token_hash" SET NOT NULL;--> statement-breakpoint
-- Mail stored before teams were tagged stays hidden from every outbox view; its one-use links are removed.
UPDATE "outbox" SET "text" = regexp_replace(regexp_replace("text", '([?&]token=)[^\s&#"''<>]+', '\1[redacted]', 'gi'), '(/reset-password/)[^\s?#"''<>/]+', '\1[redacted]', 'gi');--> statement-breakpoint
ALTER TABLE "outbox" ADD CONSTRAINT "outbox_team_id_teams_id_fk" FOREIGN KEY ("team_id") REFERENCES "public"."teams"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "outbox_team_idx" ON "outbox" USING btree ("team_id","id");--> statement-breakpoint
CREATE UNIQUE INDEX "share_links_token_hash_idx" ON "share_links" USING btree ("token_hash");--> statement-breakpoint
ALTER TABLE "outbox" DROP COLUMN "raw";
