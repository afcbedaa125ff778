CREATE TABLE "proof_sheets" (
	"program_id" uuid PRIMARY KEY NOT NULL,
	"user_id" uuid NOT NULL,
	"properties" json NOT NULL,
	"checks" json NOT NULL,
	"updated_at" timestamp with time zone NOT NULL
);
--> statement-breakpoint
ALTER TABLE "proof_sheets" ADD CONSTRAINT "proof_sheets_program_id_programs_id_fk" FOREIGN KEY ("program_id") REFERENCES "public"."programs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "proof_sheets" ADD CONSTRAINT "proof_sheets_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;