ALTER TABLE "organisations" ADD COLUMN "postal_address" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "organisations" ADD COLUMN "email" text;--> statement-breakpoint
ALTER TABLE "organisations" ADD COLUMN "phone" text;