ALTER TABLE "family_revisions" ALTER COLUMN "print_recipe" SET DEFAULT '{"perimeters":null,"infillPct":null}'::jsonb;--> statement-breakpoint
UPDATE "family_revisions" SET "print_recipe" = ("print_recipe" - 'wallLoops') || jsonb_build_object('perimeters', "print_recipe"->'wallLoops') WHERE "print_recipe" ? 'wallLoops' AND NOT ("print_recipe" ? 'perimeters');
