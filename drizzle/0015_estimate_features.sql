-- Designs hold features. A design stored before features existed kept one fountain's water system
-- at the top level (outlets, supply, branches, pumpModelId, basin); this moves those into one
-- fountain feature with the id "fountain-1" and leaves everything else as it was, so every stored
-- estimate and every job's frozen copy prices exactly as before. The same rule as upgradeDesign()
-- in src/lib/estimating/upgrade.ts, which also applies it on read.
CREATE OR REPLACE FUNCTION pg_temp.upgrade_design(d jsonb) RETURNS jsonb
LANGUAGE sql IMMUTABLE AS $$
	SELECT CASE
		WHEN d IS NULL OR jsonb_typeof(d) <> 'object'
			OR NOT (d ?| array['outlets', 'supply', 'branches', 'pumpModelId', 'basin']) THEN d
		ELSE (d - 'outlets' - 'supply' - 'branches' - 'pumpModelId' - 'basin')
			|| jsonb_build_object(
				'features',
				CASE
					WHEN d ?| array['outlets', 'supply', 'branches', 'basin'] THEN jsonb_build_array(
						jsonb_build_object('id', 'fountain-1', 'kind', 'fountain', 'name', 'Fountain')
						|| jsonb_strip_nulls(jsonb_build_object(
							'outlets', d -> 'outlets',
							'supply', d -> 'supply',
							'branches', d -> 'branches',
							'pumpModelId', d -> 'pumpModelId',
							'basin', d -> 'basin'
						))
					)
					ELSE '[]'::jsonb
				END || coalesce(d -> 'features', '[]'::jsonb)
			)
	END
$$;
--> statement-breakpoint
UPDATE "estimates" SET "design" = pg_temp.upgrade_design("design")
WHERE "design" ?| array['outlets', 'supply', 'branches', 'pumpModelId', 'basin'];
--> statement-breakpoint
UPDATE "jobs" SET "frozen" = jsonb_set("frozen", '{design}', pg_temp.upgrade_design("frozen" -> 'design'))
WHERE jsonb_typeof("frozen" -> 'design') = 'object'
	AND ("frozen" -> 'design') ?| array['outlets', 'supply', 'branches', 'pumpModelId', 'basin'];
