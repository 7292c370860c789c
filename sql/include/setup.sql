-- Shared set-up of the regression tests (\i from each test file): the
-- extension, and pg_temp.err(sql), which runs sql and shows the SQLSTATE,
-- message and detail of the error it raises.
SET client_min_messages = warning;
CREATE EXTENSION IF NOT EXISTS striae;
RESET client_min_messages;
CREATE FUNCTION pg_temp.err(q text) RETURNS text LANGUAGE plpgsql AS $$
DECLARE d text;
BEGIN
  EXECUTE q;
  RETURN 'no error';
EXCEPTION WHEN OTHERS THEN
  GET STACKED DIAGNOSTICS d = PG_EXCEPTION_DETAIL;
  RETURN SQLSTATE || ': ' || SQLERRM || CASE WHEN d <> '' THEN ' | ' || d ELSE '' END;
END $$;
