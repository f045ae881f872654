CREATE TYPE "public"."certificate_status" AS ENUM('current', 'superseded');--> statement-breakpoint
CREATE TYPE "public"."outbound_mail_kind" AS ENUM('certificate-issued', 'measurement-returned', 'work-requested', 'invitation', 'password-reset');--> statement-breakpoint
CREATE TYPE "public"."outbound_mail_status" AS ENUM('queued', 'sending', 'sent', 'retrying', 'failed');--> statement-breakpoint
CREATE TYPE "public"."review_entry_kind" AS ENUM('comment', 'submission', 'return', 'approval');--> statement-breakpoint
CREATE TABLE "certificates" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"number" text NOT NULL,
	"revision" integer NOT NULL,
	"measurement_id" uuid NOT NULL,
	"organisation_id" uuid NOT NULL,
	"status" "certificate_status" DEFAULT 'current' NOT NULL,
	"verification_code" text NOT NULL,
	"object_key" text NOT NULL,
	"sha256" text NOT NULL,
	"byte_size" integer NOT NULL,
	"page_count" integer NOT NULL,
	"data" jsonb NOT NULL,
	"reissue_reason" text,
	"issued_by_id" uuid,
	"issued_at" timestamp with time zone DEFAULT now() NOT NULL,
	"superseded_at" timestamp with time zone,
	"superseded_by_certificate_id" uuid,
	CONSTRAINT "certificates_verification_code_unique" UNIQUE("verification_code")
);
--> statement-breakpoint
CREATE TABLE "invitations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"email" text NOT NULL,
	"name" text NOT NULL,
	"roles" text[] NOT NULL,
	"organisation_id" uuid,
	"token_hash" text NOT NULL,
	"expires_at" timestamp with time zone NOT NULL,
	"used_at" timestamp with time zone,
	"revoked_at" timestamp with time zone,
	"invited_by_id" uuid,
	"person_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "invitations_token_hash_unique" UNIQUE("token_hash"),
	CONSTRAINT "invitations_email_lower_case" CHECK ("invitations"."email" = lower("invitations"."email"))
);
--> statement-breakpoint
CREATE TABLE "organisation_contacts" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"name" text NOT NULL,
	"email" text NOT NULL,
	"position" text,
	"phone" text,
	"receives_certificates" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "organisation_contacts_email_lower_case" CHECK ("organisation_contacts"."email" = lower("organisation_contacts"."email"))
);
--> statement-breakpoint
CREATE TABLE "outbound_mail" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"kind" "outbound_mail_kind" NOT NULL,
	"to_addresses" text[] NOT NULL,
	"subject" text NOT NULL,
	"text_body" text NOT NULL,
	"html_body" text NOT NULL,
	"status" "outbound_mail_status" DEFAULT 'queued' NOT NULL,
	"attempts" integer DEFAULT 0 NOT NULL,
	"last_error" text,
	"next_attempt_at" timestamp with time zone DEFAULT now() NOT NULL,
	"sent_at" timestamp with time zone,
	"message_id" text,
	"subject_type" text,
	"subject_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "password_resets" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"person_id" uuid NOT NULL,
	"token_hash" text NOT NULL,
	"expires_at" timestamp with time zone NOT NULL,
	"used_at" timestamp with time zone,
	"requested_by_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "password_resets_token_hash_unique" UNIQUE("token_hash")
);
--> statement-breakpoint
CREATE TABLE "review_entries" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"measurement_id" uuid NOT NULL,
	"author_id" uuid,
	"kind" "review_entry_kind" DEFAULT 'comment' NOT NULL,
	"body" text NOT NULL,
	"analysis_run_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "measurements" ADD COLUMN "submitted_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "measurements" ADD COLUMN "submitted_by_id" uuid;--> statement-breakpoint
ALTER TABLE "measurements" ADD COLUMN "approved_by_id" uuid;--> statement-breakpoint
ALTER TABLE "measurements" ADD COLUMN "approved_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "people" ADD COLUMN "last_sign_in_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "people" ADD COLUMN "deactivated_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "certificates" ADD CONSTRAINT "certificates_measurement_id_measurements_id_fk" FOREIGN KEY ("measurement_id") REFERENCES "public"."measurements"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "certificates" ADD CONSTRAINT "certificates_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "certificates" ADD CONSTRAINT "certificates_issued_by_id_people_id_fk" FOREIGN KEY ("issued_by_id") REFERENCES "public"."people"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invitations" ADD CONSTRAINT "invitations_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invitations" ADD CONSTRAINT "invitations_invited_by_id_people_id_fk" FOREIGN KEY ("invited_by_id") REFERENCES "public"."people"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invitations" ADD CONSTRAINT "invitations_person_id_people_id_fk" FOREIGN KEY ("person_id") REFERENCES "public"."people"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "organisation_contacts" ADD CONSTRAINT "organisation_contacts_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "password_resets" ADD CONSTRAINT "password_resets_person_id_people_id_fk" FOREIGN KEY ("person_id") REFERENCES "public"."people"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "password_resets" ADD CONSTRAINT "password_resets_requested_by_id_people_id_fk" FOREIGN KEY ("requested_by_id") REFERENCES "public"."people"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_entries" ADD CONSTRAINT "review_entries_measurement_id_measurements_id_fk" FOREIGN KEY ("measurement_id") REFERENCES "public"."measurements"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_entries" ADD CONSTRAINT "review_entries_author_id_people_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."people"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_entries" ADD CONSTRAINT "review_entries_analysis_run_id_analysis_runs_id_fk" FOREIGN KEY ("analysis_run_id") REFERENCES "public"."analysis_runs"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "certificates_number_revision_idx" ON "certificates" USING btree ("number","revision");--> statement-breakpoint
CREATE INDEX "certificates_measurement_idx" ON "certificates" USING btree ("measurement_id");--> statement-breakpoint
CREATE INDEX "certificates_organisation_idx" ON "certificates" USING btree ("organisation_id");--> statement-breakpoint
CREATE INDEX "certificates_sha256_idx" ON "certificates" USING btree ("sha256");--> statement-breakpoint
CREATE INDEX "invitations_email_idx" ON "invitations" USING btree ("email");--> statement-breakpoint
CREATE INDEX "organisation_contacts_organisation_idx" ON "organisation_contacts" USING btree ("organisation_id");--> statement-breakpoint
CREATE INDEX "outbound_mail_due_idx" ON "outbound_mail" USING btree ("status","next_attempt_at");--> statement-breakpoint
CREATE INDEX "outbound_mail_created_idx" ON "outbound_mail" USING btree ("created_at");--> statement-breakpoint
CREATE INDEX "password_resets_person_idx" ON "password_resets" USING btree ("person_id");--> statement-breakpoint
CREATE INDEX "review_entries_measurement_idx" ON "review_entries" USING btree ("measurement_id","created_at");--> statement-breakpoint
ALTER TABLE "measurements" ADD CONSTRAINT "measurements_submitted_by_id_people_id_fk" FOREIGN KEY ("submitted_by_id") REFERENCES "public"."people"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "measurements" ADD CONSTRAINT "measurements_approved_by_id_people_id_fk" FOREIGN KEY ("approved_by_id") REFERENCES "public"."people"("id") ON DELETE set null ON UPDATE no action;