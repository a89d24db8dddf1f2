CREATE TABLE "log_days" (
	"upload_id" uuid NOT NULL,
	"date" date NOT NULL,
	"sample_count" integer NOT NULL,
	"covered_h" double precision NOT NULL,
	"energy_in_wh" double precision NOT NULL,
	"energy_out_wh" double precision NOT NULL,
	"soc_min_fraction" double precision,
	"soc_max_fraction" double precision,
	"pack_voltage_min_v" double precision NOT NULL,
	"pack_voltage_max_v" double precision NOT NULL,
	"cell_spread_max_mv" double precision,
	"cell_spread_typical_mv" double precision,
	"cell_spread_p95_mv" double precision,
	"temperature_min_c" double precision,
	"temperature_max_c" double precision,
	CONSTRAINT "log_days_pkey" PRIMARY KEY("upload_id","date")
);
--> statement-breakpoint
CREATE TABLE "log_mappings" (
	"vehicle_id" uuid PRIMARY KEY NOT NULL,
	"mapping" jsonb NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_by" text
);
--> statement-breakpoint
CREATE TABLE "log_samples" (
	"upload_id" uuid NOT NULL,
	"ts" timestamp with time zone NOT NULL,
	"pack_voltage_v" real NOT NULL,
	"current_a" real NOT NULL,
	"soc_fraction" real,
	"temperatures_c" real[],
	"cell_voltages_v" real[],
	CONSTRAINT "log_samples_pkey" PRIMARY KEY("upload_id","ts")
);
--> statement-breakpoint
CREATE TABLE "log_uploads" (
	"id" uuid PRIMARY KEY NOT NULL,
	"vehicle_id" uuid NOT NULL,
	"file_name" text NOT NULL,
	"size_bytes" integer NOT NULL,
	"row_count" integer NOT NULL,
	"first_ts" timestamp with time zone NOT NULL,
	"last_ts" timestamp with time zone NOT NULL,
	"mapping" jsonb NOT NULL,
	"spread_trend" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"created_by" text
);
--> statement-breakpoint
ALTER TABLE "log_days" ADD CONSTRAINT "log_days_upload_id_log_uploads_id_fk" FOREIGN KEY ("upload_id") REFERENCES "public"."log_uploads"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "log_mappings" ADD CONSTRAINT "log_mappings_vehicle_id_vehicles_id_fk" FOREIGN KEY ("vehicle_id") REFERENCES "public"."vehicles"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "log_mappings" ADD CONSTRAINT "log_mappings_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "log_samples" ADD CONSTRAINT "log_samples_upload_id_log_uploads_id_fk" FOREIGN KEY ("upload_id") REFERENCES "public"."log_uploads"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "log_uploads" ADD CONSTRAINT "log_uploads_vehicle_id_vehicles_id_fk" FOREIGN KEY ("vehicle_id") REFERENCES "public"."vehicles"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "log_uploads" ADD CONSTRAINT "log_uploads_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "log_uploads_vehicle_idx" ON "log_uploads" USING btree ("vehicle_id","created_at");