CREATE TABLE "number_counters" (
	"kind" text NOT NULL,
	"year" integer NOT NULL,
	"last_value" integer NOT NULL,
	CONSTRAINT "number_counters_kind_year_pk" PRIMARY KEY("kind","year")
);
