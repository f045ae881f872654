CREATE TYPE "public"."analysis_run_status" AS ENUM('queued', 'running', 'succeeded', 'failed');--> statement-breakpoint
CREATE TYPE "public"."decision_rule" AS ENUM('simple', 'guarded');--> statement-breakpoint
CREATE TYPE "public"."equipment_kind" AS ENUM('camera', 'target', 'rail-scale', 'collimator', 'auxiliary-lens');--> statement-breakpoint
CREATE TYPE "public"."focus_operator" AS ENUM('gradient-energy', 'laplacian-variance', 'brenner', 'normalised-variance');--> statement-breakpoint
CREATE TYPE "public"."measurement_method" AS ENUM('finite-conjugate', 'multi-conjugate', 'displacement', 'collimator', 'auxiliary-lens');--> statement-breakpoint
CREATE TYPE "public"."measurement_status" AS ENUM('draft', 'analysing', 'analysed', 'analysis-failed', 'submitted', 'approved', 'returned', 'certified');--> statement-breakpoint
CREATE TYPE "public"."sweep_moving" AS ENUM('sensor', 'lens');--> statement-breakpoint
CREATE TYPE "public"."work_order_status" AS ENUM('requested', 'open', 'in-progress', 'completed', 'cancelled');--> statement-breakpoint
CREATE TABLE "analysis_runs" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"measurement_id" uuid NOT NULL,
	"version" integer NOT NULL,
	"status" "analysis_run_status" DEFAULT 'queued' NOT NULL,
	"manifest" jsonb NOT NULL,
	"result" jsonb,
	"error_message" text,
	"frames_done" integer DEFAULT 0 NOT NULL,
	"frames_total" integer DEFAULT 0 NOT NULL,
	"attempts" integer DEFAULT 0 NOT NULL,
	"job_id" text,
	"requested_by_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"started_at" timestamp with time zone,
	"finished_at" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "equipment" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"kind" "equipment_kind" NOT NULL,
	"identifier" text NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"serial_number" text,
	"values" jsonb NOT NULL,
	"calibration_reference" text NOT NULL,
	"calibration_due_date" text NOT NULL,
	"active" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "equipment_identifier_unique" UNIQUE("identifier")
);
--> statement-breakpoint
CREATE TABLE "frames" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"sweep_id" uuid NOT NULL,
	"file_name" text NOT NULL,
	"position_mm" double precision,
	"object_key" text NOT NULL,
	"thumbnail_key" text,
	"preview_key" text,
	"content_type" text NOT NULL,
	"byte_size" bigint NOT NULL,
	"width_px" integer NOT NULL,
	"height_px" integer NOT NULL,
	"bit_depth" integer NOT NULL,
	"sha256" text NOT NULL,
	"excluded" boolean DEFAULT false NOT NULL,
	"purged_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "lenses" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"work_order_id" uuid NOT NULL,
	"identifier" text NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"part_number" text,
	"nominal_focal_length_mm" double precision NOT NULL,
	"tolerance_percent" double precision,
	"tolerance_mm" double precision,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "lenses_tolerance_given" CHECK ("lenses"."tolerance_percent" is not null or "lenses"."tolerance_mm" is not null),
	CONSTRAINT "lenses_nominal_not_zero" CHECK ("lenses"."nominal_focal_length_mm" <> 0)
);
--> statement-breakpoint
CREATE TABLE "measurements" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"number" text NOT NULL,
	"lens_id" uuid NOT NULL,
	"method" "measurement_method" NOT NULL,
	"status" "measurement_status" DEFAULT 'draft' NOT NULL,
	"camera_id" uuid,
	"target_id" uuid,
	"rail_scale_id" uuid,
	"collimator_id" uuid,
	"auxiliary_lens_id" uuid,
	"equipment_overrides" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"temperature_c" double precision,
	"relative_humidity_percent" double precision,
	"focus_operator" "focus_operator" DEFAULT 'gradient-energy' NOT NULL,
	"notes" text,
	"performed_by_id" uuid,
	"measured_on" text,
	"current_analysis_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "measurements_number_unique" UNIQUE("number")
);
--> statement-breakpoint
CREATE TABLE "sweeps" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"measurement_id" uuid NOT NULL,
	"position" integer NOT NULL,
	"moving" "sweep_moving" NOT NULL,
	"object_position_mm" double precision,
	"lens_position_mm" double precision,
	"sensor_position_mm" double precision,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "work_orders" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"number" text NOT NULL,
	"organisation_id" uuid NOT NULL,
	"title" text NOT NULL,
	"client_reference" text,
	"notes" text,
	"status" "work_order_status" DEFAULT 'open' NOT NULL,
	"decision_rule" "decision_rule" DEFAULT 'simple' NOT NULL,
	"due_date" text,
	"created_by_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "work_orders_number_unique" UNIQUE("number")
);
--> statement-breakpoint
ALTER TABLE "analysis_runs" ADD CONSTRAINT "analysis_runs_measurement_id_measurements_id_fk" FOREIGN KEY ("measurement_id") REFERENCES "public"."measurements"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "analysis_runs" ADD CONSTRAINT "analysis_runs_requested_by_id_people_id_fk" FOREIGN KEY ("requested_by_id") REFERENCES "public"."people"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "frames" ADD CONSTRAINT "frames_sweep_id_sweeps_id_fk" FOREIGN KEY ("sweep_id") REFERENCES "public"."sweeps"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lenses" ADD CONSTRAINT "lenses_work_order_id_work_orders_id_fk" FOREIGN KEY ("work_order_id") REFERENCES "public"."work_orders"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "measurements" ADD CONSTRAINT "measurements_lens_id_lenses_id_fk" FOREIGN KEY ("lens_id") REFERENCES "public"."lenses"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "measurements" ADD CONSTRAINT "measurements_camera_id_equipment_id_fk" FOREIGN KEY ("camera_id") REFERENCES "public"."equipment"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "measurements" ADD CONSTRAINT "measurements_target_id_equipment_id_fk" FOREIGN KEY ("target_id") REFERENCES "public"."equipment"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "measurements" ADD CONSTRAINT "measurements_rail_scale_id_equipment_id_fk" FOREIGN KEY ("rail_scale_id") REFERENCES "public"."equipment"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "measurements" ADD CONSTRAINT "measurements_collimator_id_equipment_id_fk" FOREIGN KEY ("collimator_id") REFERENCES "public"."equipment"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "measurements" ADD CONSTRAINT "measurements_auxiliary_lens_id_equipment_id_fk" FOREIGN KEY ("auxiliary_lens_id") REFERENCES "public"."equipment"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "measurements" ADD CONSTRAINT "measurements_performed_by_id_people_id_fk" FOREIGN KEY ("performed_by_id") REFERENCES "public"."people"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sweeps" ADD CONSTRAINT "sweeps_measurement_id_measurements_id_fk" FOREIGN KEY ("measurement_id") REFERENCES "public"."measurements"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "work_orders" ADD CONSTRAINT "work_orders_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "work_orders" ADD CONSTRAINT "work_orders_created_by_id_people_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."people"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "analysis_runs_measurement_version_idx" ON "analysis_runs" USING btree ("measurement_id","version");--> statement-breakpoint
CREATE INDEX "equipment_kind_idx" ON "equipment" USING btree ("kind");--> statement-breakpoint
CREATE UNIQUE INDEX "frames_sweep_file_idx" ON "frames" USING btree ("sweep_id","file_name");--> statement-breakpoint
CREATE INDEX "frames_sweep_idx" ON "frames" USING btree ("sweep_id");--> statement-breakpoint
CREATE INDEX "lenses_work_order_idx" ON "lenses" USING btree ("work_order_id");--> statement-breakpoint
CREATE INDEX "lenses_part_number_idx" ON "lenses" USING btree ("part_number");--> statement-breakpoint
CREATE INDEX "measurements_lens_idx" ON "measurements" USING btree ("lens_id");--> statement-breakpoint
CREATE INDEX "measurements_status_idx" ON "measurements" USING btree ("status");--> statement-breakpoint
CREATE INDEX "measurements_performed_by_idx" ON "measurements" USING btree ("performed_by_id");--> statement-breakpoint
CREATE UNIQUE INDEX "sweeps_measurement_position_idx" ON "sweeps" USING btree ("measurement_id","position");--> statement-breakpoint
CREATE INDEX "work_orders_organisation_idx" ON "work_orders" USING btree ("organisation_id");--> statement-breakpoint
CREATE INDEX "work_orders_status_idx" ON "work_orders" USING btree ("status");--> statement-breakpoint
CREATE INDEX "work_orders_due_idx" ON "work_orders" USING btree ("due_date");--> statement-breakpoint
CREATE INDEX "work_orders_created_idx" ON "work_orders" USING btree ("created_at");