-- Upgrade from 0.1.0 to 0.2.0: changes to objects that 0.1.0 already had.
-- The fragments wholly new in 0.2.0 follow this file in the built script
-- (Makefile: NEW_IN_0_2_0). tests/external/check_upgrade.sh compares the
-- catalogue of an updated database with a fresh install object by object.
\echo Use "ALTER EXTENSION striae UPDATE TO '0.2.0'" to load this file. \quit
