CREATE TYPE "public"."invitation_role" AS ENUM('editor', 'viewer', 'advisor');--> statement-breakpoint
CREATE TYPE "public"."review_close_reason" AS ENUM('done', 'cancelled', 'declined');--> statement-breakpoint
CREATE TYPE "public"."review_payment_state" AS ENUM('none', 'unpaid', 'failed', 'paid', 'refund_pending', 'refunded');--> statement-breakpoint
CREATE TYPE "public"."review_pin_kind" AS ENUM('general', 'appliance', 'source', 'battery', 'result');--> statement-breakpoint
CREATE TYPE "public"."review_state" AS ENUM('requested', 'awaiting_payment', 'in_progress', 'answered', 'closed');--> statement-breakpoint
CREATE TYPE "public"."review_verdict" AS ENUM('sound', 'sound_with_changes', 'rethink');--> statement-breakpoint
CREATE TYPE "public"."payment_status" AS ENUM('pending', 'paid', 'failed', 'refund_pending', 'refunded');--> statement-breakpoint
CREATE TABLE "vehicle_invitations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"vehicle_id" uuid NOT NULL,
	"email" text NOT NULL,
	"role" "invitation_role" NOT NULL,
	"token_hash" text NOT NULL,
	"invited_by" text,
	"expires_at" timestamp with time zone NOT NULL,
	"accepted_at" timestamp with time zone,
	"accepted_by" text,
	"revoked_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "advisor_profiles" (
	"user_id" text PRIMARY KEY NOT NULL,
	"headline" text DEFAULT '' NOT NULL,
	"bio" text DEFAULT '' NOT NULL,
	"specialities" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"fee_amount" numeric(12, 2) DEFAULT '0' NOT NULL,
	"currency" text DEFAULT 'EUR' NOT NULL,
	"accepting" boolean DEFAULT true NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "review_comments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"review_id" uuid NOT NULL,
	"author_id" text,
	"kind" text DEFAULT 'comment' NOT NULL,
	"body" text NOT NULL,
	"pin_kind" "review_pin_kind" DEFAULT 'general' NOT NULL,
	"pin_item_id" text,
	"pin_label" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "review_reads" (
	"review_id" uuid NOT NULL,
	"user_id" text NOT NULL,
	"last_read_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "review_reads_review_id_user_id_pk" PRIMARY KEY("review_id","user_id")
);
--> statement-breakpoint
CREATE TABLE "reviews" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"vehicle_id" uuid NOT NULL,
	"scenario_id" uuid,
	"scenario_name" text NOT NULL,
	"requester_id" text,
	"advisor_id" text NOT NULL,
	"message" text NOT NULL,
	"state" "review_state" NOT NULL,
	"fee_amount" numeric(12, 2) DEFAULT '0' NOT NULL,
	"currency" text DEFAULT 'EUR' NOT NULL,
	"payment_state" "review_payment_state" DEFAULT 'none' NOT NULL,
	"verdict" "review_verdict",
	"summary" text,
	"close_reason" "review_close_reason",
	"paid_at" timestamp with time zone,
	"started_at" timestamp with time zone,
	"answered_at" timestamp with time zone,
	"closed_at" timestamp with time zone,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "processed_payment_events" (
	"event_id" text PRIMARY KEY NOT NULL,
	"type" text NOT NULL,
	"object_id" text,
	"processed_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "review_payments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"review_id" uuid NOT NULL,
	"checkout_session_id" text NOT NULL,
	"payment_intent_id" text,
	"refund_id" text,
	"amount_minor" integer NOT NULL,
	"currency" text NOT NULL,
	"status" "payment_status" DEFAULT 'pending' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "vehicle_invitations" ADD CONSTRAINT "vehicle_invitations_vehicle_id_vehicles_id_fk" FOREIGN KEY ("vehicle_id") REFERENCES "public"."vehicles"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "vehicle_invitations" ADD CONSTRAINT "vehicle_invitations_invited_by_users_id_fk" FOREIGN KEY ("invited_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "vehicle_invitations" ADD CONSTRAINT "vehicle_invitations_accepted_by_users_id_fk" FOREIGN KEY ("accepted_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "advisor_profiles" ADD CONSTRAINT "advisor_profiles_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_comments" ADD CONSTRAINT "review_comments_review_id_reviews_id_fk" FOREIGN KEY ("review_id") REFERENCES "public"."reviews"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_comments" ADD CONSTRAINT "review_comments_author_id_users_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_reads" ADD CONSTRAINT "review_reads_review_id_reviews_id_fk" FOREIGN KEY ("review_id") REFERENCES "public"."reviews"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_reads" ADD CONSTRAINT "review_reads_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_vehicle_id_vehicles_id_fk" FOREIGN KEY ("vehicle_id") REFERENCES "public"."vehicles"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_scenario_id_scenarios_id_fk" FOREIGN KEY ("scenario_id") REFERENCES "public"."scenarios"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_requester_id_users_id_fk" FOREIGN KEY ("requester_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_advisor_id_users_id_fk" FOREIGN KEY ("advisor_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_payments" ADD CONSTRAINT "review_payments_review_id_reviews_id_fk" FOREIGN KEY ("review_id") REFERENCES "public"."reviews"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "vehicle_invitations_token_key" ON "vehicle_invitations" USING btree ("token_hash");--> statement-breakpoint
CREATE INDEX "vehicle_invitations_vehicle_idx" ON "vehicle_invitations" USING btree ("vehicle_id","created_at");--> statement-breakpoint
CREATE INDEX "review_comments_review_idx" ON "review_comments" USING btree ("review_id","created_at");--> statement-breakpoint
CREATE INDEX "reviews_vehicle_idx" ON "reviews" USING btree ("vehicle_id");--> statement-breakpoint
CREATE INDEX "reviews_advisor_idx" ON "reviews" USING btree ("advisor_id","state");--> statement-breakpoint
CREATE INDEX "reviews_requester_idx" ON "reviews" USING btree ("requester_id");--> statement-breakpoint
CREATE UNIQUE INDEX "review_payments_session_key" ON "review_payments" USING btree ("checkout_session_id");--> statement-breakpoint
CREATE INDEX "review_payments_review_idx" ON "review_payments" USING btree ("review_id");--> statement-breakpoint
CREATE INDEX "review_payments_intent_idx" ON "review_payments" USING btree ("payment_intent_id");