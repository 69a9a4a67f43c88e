-- Extensions used by the fit search (cube), suggestions and "did you mean" (pg_trgm), and accent-insensitive search (unaccent).
CREATE EXTENSION IF NOT EXISTS cube;
--> statement-breakpoint
CREATE EXTENSION IF NOT EXISTS pg_trgm;
--> statement-breakpoint
CREATE EXTENSION IF NOT EXISTS unaccent;
