import type { Migration } from "../migrator";

// A typed word becomes a prefix match on its stem alone when the stem begins the word ("recapped" →
// 'recap':*): 'recapped':* | 'recap':* matches nothing more, and the planner estimates one prefix far
// better than an OR of two. A stem that does not begin the word ("battery" → 'batteri') keeps both.

const fn = (when: string) => `
  CREATE OR REPLACE FUNCTION loadline_search_query(q text) RETURNS tsquery
  LANGUAGE sql IMMUTABLE PARALLEL SAFE STRICT
  AS $$
    WITH words AS (
      SELECT w.lexeme AS word,
             (SELECT min(e.lexeme) FROM unnest(to_tsvector('english'::regconfig, w.lexeme)) e) AS stem
        FROM unnest(to_tsvector('simple'::regconfig, loadline_unaccent(q))) w
    ), kept AS (
      SELECT * FROM words WHERE stem IS NOT NULL OR NOT EXISTS (SELECT 1 FROM words WHERE stem IS NOT NULL)
    )
    SELECT string_agg(${when}, ' & ' ORDER BY word)::tsquery
      FROM kept $$`;

export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(
    fn(`CASE WHEN stem IS NULL THEN format('%L:*', word)
             WHEN starts_with(word, stem) THEN format('%L:*', stem)
             ELSE format('(%L:* | %L:*)', word, stem) END`),
  );
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(
    fn(`CASE WHEN stem IS NULL OR stem = word THEN format('%L:*', word)
             ELSE format('(%L:* | %L:*)', word, stem) END`),
  );
};
