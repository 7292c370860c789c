// The one place the glue includes PostgreSQL. Standard and Eigen headers come
// first (PostgreSQL's macros rename snprintf and define Min/Max), then the
// server headers inside extern "C".
#pragma once

#include <cmath>
#include <cstdint>
#include <cstring>
#include <new>
#include <string>

#include "../core/core.hpp"

extern "C" {
#include "postgres.h"
#include "fmgr.h"
#include "miscadmin.h"
#include "mb/pg_wchar.h"
#include "funcapi.h"
#include "libpq/pqformat.h"
#include "utils/array.h"
#include "utils/builtins.h"
#include "utils/float.h"
#include "utils/lsyscache.h"
#include "common/hashfn.h"
#include "catalog/pg_type.h"
#include "nodes/execnodes.h"
#include "utils/tuplestore.h"
#include "access/htup_details.h"
}

// C symbol = SQL name; declared extern "C" so the SQL script's AS 'MODULE_PATHNAME'
// finds it.
#define STRIAE_FUNCTION(name)        \
  extern "C" {                       \
  PG_FUNCTION_INFO_V1(name);         \
  Datum name(PG_FUNCTION_ARGS);      \
  }                                  \
  Datum name(PG_FUNCTION_ARGS)
