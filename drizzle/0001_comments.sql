CREATE TABLE "spool_comments" (
	"id" serial PRIMARY KEY NOT NULL,
	"spool_id" text NOT NULL,
	"revision" integer NOT NULL,
	"element_id" text,
	"body" text NOT NULL,
	"user_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"resolved_at" timestamp with time zone,
	"resolved_by" text
);
--> statement-breakpoint
ALTER TABLE "spool_comments" ADD CONSTRAINT "spool_comments_spool_id_spools_id_fk" FOREIGN KEY ("spool_id") REFERENCES "public"."spools"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "spool_comments" ADD CONSTRAINT "spool_comments_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "spool_comments" ADD CONSTRAINT "spool_comments_resolved_by_user_id_fk" FOREIGN KEY ("resolved_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "spool_comments_spool_idx" ON "spool_comments" USING btree ("spool_id","id");