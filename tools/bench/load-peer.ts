/**
 * The load benchmark's baseline: a bare Express 5 app with one pg pool and one route doing the
 * designs list query as the API runs it for a designer (their designs with owner, latest version and
 * its author, newest first, one page, then the latest review of each design on it), nothing else: no session, no validation, no count.
 * Started by tools/bench/load.ts with PORT, DATABASE_URL, OWNER_ID and PAGE_SIZE.
 */
import express from 'express';
import pg from 'pg';

const port = Number(process.env.PORT);
const ownerId = process.env.OWNER_ID ?? '';
const pageSize = Number(process.env.PAGE_SIZE ?? 20);
const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 10 });

const LIST_QUERY = `
  select page.*, latest_review.review_state, latest_review.review_version
    from (
      select d.id, d.name, d.archived, d.latest_version, d.created_at, d.updated_at,
             owner.id as owner_id, owner.display_name as owner_name, owner.email as owner_email,
             latest.message, latest.created_at as version_created_at, latest.format_version, latest.engine_version, latest.figures,
             author.id as author_id, author.display_name as author_name, author.email as author_email
        from designs d
        join users owner on owner.id = d.owner_id
        join design_versions latest on latest.design_id = d.id and latest.number = d.latest_version
        join users author on author.id = latest.author_id
       where d.owner_id = $1 and d.archived = false
       order by d.updated_at desc, d.id
       limit $2 offset 0
    ) page
    left join lateral (
      select r.state as review_state, r.version_number as review_version
        from reviews r where r.design_id = page.id order by r.created_at desc, r.id desc limit 1
    ) latest_review on true
   order by page.updated_at desc, page.id`;

const app = express();
app.disable('x-powered-by');
app.get('/designs', async (_req, res) => {
  const { rows } = await pool.query(LIST_QUERY, [ownerId, pageSize]);
  res.json({ items: rows });
});
const server = app.listen(port, '127.0.0.1', () => process.stdout.write('baseline serving\n'));
process.on('SIGTERM', () => {
  server.close(() => void pool.end().then(() => process.exit(0)));
  server.closeAllConnections();
});
