CREATE TABLE "grade_history" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"submission_id" uuid NOT NULL,
	"report" jsonb,
	"grading_note" text,
	"auto_score" double precision,
	"graded_at" timestamp with time zone NOT NULL,
	"replaced_at" timestamp with time zone NOT NULL
);
--> statement-breakpoint
CREATE TABLE "lab_attachments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lab_id" uuid NOT NULL,
	"filename" text NOT NULL,
	"content_type" text NOT NULL,
	"size" integer NOT NULL,
	"data" "bytea" NOT NULL,
	"created_at" timestamp with time zone NOT NULL
);
--> statement-breakpoint
CREATE TABLE "lab_copies" (
	"lab_id" uuid NOT NULL,
	"student_id" uuid NOT NULL,
	"program_id" uuid NOT NULL,
	"created_at" timestamp with time zone NOT NULL,
	CONSTRAINT "lab_copies_lab_id_student_id_pk" PRIMARY KEY("lab_id","student_id")
);
--> statement-breakpoint
ALTER TABLE "submissions" DROP CONSTRAINT "submissions_program_id_programs_id_fk";
--> statement-breakpoint
ALTER TABLE "submissions" ALTER COLUMN "program_id" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "submissions" ALTER COLUMN "score" SET DATA TYPE double precision;--> statement-breakpoint
ALTER TABLE "labs" ADD COLUMN "summary" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "labs" ADD COLUMN "panel" jsonb DEFAULT '{"kind":"builtIn","id":"reversing-conveyor"}'::jsonb NOT NULL;--> statement-breakpoint
ALTER TABLE "labs" ADD COLUMN "starter_kind" text DEFAULT 'empty' NOT NULL;--> statement-breakpoint
ALTER TABLE "labs" ADD COLUMN "starter_program_id" uuid;--> statement-breakpoint
ALTER TABLE "labs" ADD COLUMN "starter_version" integer;--> statement-breakpoint
ALTER TABLE "labs" ADD COLUMN "total_points" integer DEFAULT 100 NOT NULL;--> statement-breakpoint
ALTER TABLE "labs" ADD COLUMN "due_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "labs" ADD COLUMN "late_policy" jsonb DEFAULT '{"kind":"accept"}'::jsonb NOT NULL;--> statement-breakpoint
ALTER TABLE "labs" ADD COLUMN "template_id" text;--> statement-breakpoint
ALTER TABLE "labs" ADD COLUMN "demo" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "labs" ADD COLUMN "updated_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "submissions" ADD COLUMN "document" jsonb;--> statement-breakpoint
ALTER TABLE "submissions" ADD COLUMN "late" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "submissions" ADD COLUMN "penalty_percent" double precision DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "submissions" ADD COLUMN "grading_note" text;--> statement-breakpoint
ALTER TABLE "submissions" ADD COLUMN "auto_score" double precision;--> statement-breakpoint
ALTER TABLE "submissions" ADD COLUMN "override_score" double precision;--> statement-breakpoint
ALTER TABLE "submissions" ADD COLUMN "override_reason" text;--> statement-breakpoint
ALTER TABLE "submissions" ADD COLUMN "feedback" text;--> statement-breakpoint
ALTER TABLE "submissions" ADD COLUMN "graded_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "submissions" ADD COLUMN "returned_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "grade_history" ADD CONSTRAINT "grade_history_submission_id_submissions_id_fk" FOREIGN KEY ("submission_id") REFERENCES "public"."submissions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lab_attachments" ADD CONSTRAINT "lab_attachments_lab_id_labs_id_fk" FOREIGN KEY ("lab_id") REFERENCES "public"."labs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lab_copies" ADD CONSTRAINT "lab_copies_lab_id_labs_id_fk" FOREIGN KEY ("lab_id") REFERENCES "public"."labs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lab_copies" ADD CONSTRAINT "lab_copies_student_id_users_id_fk" FOREIGN KEY ("student_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lab_copies" ADD CONSTRAINT "lab_copies_program_id_programs_id_fk" FOREIGN KEY ("program_id") REFERENCES "public"."programs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "grade_history_submission_idx" ON "grade_history" USING btree ("submission_id");--> statement-breakpoint
CREATE INDEX "lab_attachments_lab_idx" ON "lab_attachments" USING btree ("lab_id");--> statement-breakpoint
ALTER TABLE "submissions" ADD CONSTRAINT "submissions_program_id_programs_id_fk" FOREIGN KEY ("program_id") REFERENCES "public"."programs"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "submissions_student_idx" ON "submissions" USING btree ("student_id");