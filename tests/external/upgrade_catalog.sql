-- Every member object of the extension striae with everything that defines it,
-- one line each, sorted: two databases whose outputs are identical hold the
-- same extension. Used by check_upgrade.sh to compare a database updated from
-- 0.1.0 with a fresh install. Object ids differ between databases, so every
-- reference is printed by name (regprocedure, regtype, regoperator, ...).
\pset format unaligned
\pset tuples_only on
WITH members AS (
  SELECT d.classid, d.objid
    FROM pg_depend d JOIN pg_extension e ON d.refobjid = e.oid AND d.refclassid = 'pg_extension'::regclass
   WHERE e.extname = 'striae' AND d.deptype = 'e'
), lines AS (
  -- functions and aggregates
  SELECT 'function ' || p.oid::regprocedure || ' -> ' || pg_get_function_result(p.oid)
         || ' kind=' || p.prokind::text || ' lang=' || l.lanname || ' src=' || p.prosrc
         || ' strict=' || p.proisstrict || ' vol=' || p.provolatile::text || ' par=' || p.proparallel::text
         || ' leak=' || p.proleakproof || ' secdef=' || p.prosecdef
         || ' config=' || coalesce(array_to_string(p.proconfig, ','), '')
         || ' args=' || pg_get_function_arguments(p.oid)
         || coalesce(' agg: trans=' || a.aggtransfn::regprocedure || ' final=' || a.aggfinalfn::regproc
                     || ' combine=' || a.aggcombinefn::regproc || ' serial=' || a.aggserialfn::regproc
                     || ' deserial=' || a.aggdeserialfn::regproc || ' stype=' || a.aggtranstype::regtype
                     || ' sspace=' || a.aggtransspace || ' init=' || coalesce(a.agginitval, '-')
                     || ' fextra=' || a.aggfinalextra || ' fmodify=' || a.aggfinalmodify::text
                     || ' kindagg=' || a.aggkind::text || ' sortop=' || a.aggsortop::regoperator::text, '')
         || ' comment=' || coalesce(obj_description(p.oid, 'pg_proc'), '<none>') AS line
    FROM members m JOIN pg_proc p ON m.classid = 'pg_proc'::regclass AND m.objid = p.oid
    JOIN pg_language l ON l.oid = p.prolang
    LEFT JOIN pg_aggregate a ON a.aggfnoid = p.oid
  UNION ALL
  -- types (base, composite, arrays) with their attributes
  SELECT 'type ' || t.oid::regtype || ' typtype=' || t.typtype::text || ' len=' || t.typlen
         || ' byval=' || t.typbyval || ' align=' || t.typalign::text || ' storage=' || t.typstorage::text
         || ' in=' || t.typinput::regproc || ' out=' || t.typoutput::regproc
         || ' recv=' || t.typreceive::regproc || ' send=' || t.typsend::regproc
         || ' category=' || t.typcategory::text || ' delim=' || t.typdelim::text
         || ' elem=' || t.typelem::regtype || ' array=' || t.typarray::regtype
         || ' attrs=' || coalesce((SELECT string_agg(at.attname || ' ' || format_type(at.atttypid, at.atttypmod), ', ' ORDER BY at.attnum)
                                     FROM pg_attribute at WHERE at.attrelid = t.typrelid AND at.attnum > 0 AND NOT at.attisdropped), '')
         || ' comment=' || coalesce(obj_description(t.oid, 'pg_type'), '<none>')
    FROM members m JOIN pg_type t ON m.classid = 'pg_type'::regclass AND m.objid = t.oid
  UNION ALL
  SELECT 'operator ' || o.oid::regoperator || ' -> ' || o.oprresult::regtype || ' code=' || o.oprcode::regproc
         || ' com=' || o.oprcom::regoperator::text || ' neg=' || o.oprnegate::regoperator::text
         || ' rest=' || o.oprrest::regproc || ' join=' || o.oprjoin::regproc
         || ' merges=' || o.oprcanmerge || ' hashes=' || o.oprcanhash
         || ' comment=' || coalesce(obj_description(o.oid, 'pg_operator'), '<none>')
    FROM members m JOIN pg_operator o ON m.classid = 'pg_operator'::regclass AND m.objid = o.oid
  UNION ALL
  SELECT 'opclass ' || am.amname || ' ' || c.opcname || ' for ' || c.opcintype::regtype || ' default=' || c.opcdefault
         || ' key=' || c.opckeytype::regtype || ' family=' || f.opfname
    FROM members m JOIN pg_opclass c ON m.classid = 'pg_opclass'::regclass AND m.objid = c.oid
    JOIN pg_am am ON am.oid = c.opcmethod JOIN pg_opfamily f ON f.oid = c.opcfamily
  UNION ALL
  SELECT 'opfamily ' || am.amname || ' ' || f.opfname
         || ' ops=' || coalesce((SELECT string_agg(ao.amopstrategy || ':' || ao.amopopr::regoperator || ':' || ao.amoppurpose::text
                                   || ':' || coalesce(ao.amopsortfamily::text, '-'), ', ' ORDER BY ao.amopstrategy, ao.amopopr::regoperator::text)
                                   FROM pg_amop ao WHERE ao.amopfamily = f.oid), '')
         || ' procs=' || coalesce((SELECT string_agg(ap.amprocnum || ':' || ap.amproclefttype::regtype || ':' || ap.amprocrighttype::regtype
                                   || ':' || ap.amproc::regprocedure, ', ' ORDER BY ap.amprocnum, ap.amproc::regprocedure::text)
                                   FROM pg_amproc ap WHERE ap.amprocfamily = f.oid), '')
    FROM members m JOIN pg_opfamily f ON m.classid = 'pg_opfamily'::regclass AND m.objid = f.oid
    JOIN pg_am am ON am.oid = f.opfmethod
  UNION ALL
  SELECT 'cast ' || c.castsource::regtype || ' -> ' || c.casttarget::regtype || ' func=' || c.castfunc::regprocedure::text
         || ' context=' || c.castcontext::text || ' method=' || c.castmethod::text
         || ' comment=' || coalesce(obj_description(c.oid, 'pg_cast'), '<none>')
    FROM members m JOIN pg_cast c ON m.classid = 'pg_cast'::regclass AND m.objid = c.oid
  UNION ALL
  -- anything else (schemas, tables, views, ...) at least by its description
  SELECT 'other ' || pg_describe_object(m.classid, m.objid, 0)
    FROM members m
   WHERE m.classid NOT IN ('pg_proc'::regclass, 'pg_type'::regclass, 'pg_operator'::regclass,
                           'pg_opclass'::regclass, 'pg_opfamily'::regclass, 'pg_cast'::regclass)
)
SELECT line FROM lines ORDER BY line COLLATE "C";
