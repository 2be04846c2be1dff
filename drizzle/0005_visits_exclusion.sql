-- Issue 6: no two booked visits of one salesperson may overlap, travel buffers included.
-- btree_gist lets a GiST index compare the salesperson's id with = beside the range's &&.
create extension if not exists btree_gist;
--> statement-breakpoint
alter table "site_visits" add constraint "site_visits_blocked_valid"
	check (not isempty("blocked") and lower("blocked") = "starts_at" and upper("blocked") >= "ends_at" and "ends_at" > "starts_at");
--> statement-breakpoint
alter table "site_visits" add constraint "site_visits_no_overlap"
	exclude using gist ("salesperson_id" with =, "blocked" with &&) where ("status" = 'booked');
--> statement-breakpoint
alter table "time_off" add constraint "time_off_valid" check ("ends_at" > "starts_at");
