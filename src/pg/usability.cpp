// Glue for loading and showing data: literal checks that return a reason
// instead of raising (screening staging tables), the field-book constructor of
// fault_slip, and fixed-precision display (to_text). The work is in
// src/core/check.* and src/core/display.*.
#include "grid.hpp"

#include "../core/check.hpp"
#include "../core/display.hpp"

extern "C" {
#include "mb/pg_wchar.h"
}

using namespace striae;
using namespace striae_pg;

namespace {

constexpr size_t kReasonCap = 1024;

// A reason as text in the database encoding: the parsers echo parts of the
// literal, so cut at the first byte that is not valid in that encoding.
Datum reason_text(const char *reason) {
  const int len = static_cast<int>(std::strlen(reason));
  const int ok = pg_encoding_verifymbstr(GetDatabaseEncoding(), reason, len);
  return PointerGetDatum(cstring_to_text_with_len(reason, ok));
}

Datum check(FunctionCallInfo fcinfo, Notation kind, const char *text) {
  char reason[kReasonCap];
  const bool valid = guarded([&] { return check_literal(kind, text, reason, sizeof reason); });
  if (valid) PG_RETURN_NULL();
  return reason_text(reason);
}

// A std::string result as text. The string is emptied before any error is
// raised, so no heap memory of it is left behind by the longjmp.
Datum string_text(std::string &s) {
  text *t = static_cast<text *>(palloc_extended(VARHDRSZ + s.size(), MCXT_ALLOC_NO_OOM | MCXT_ALLOC_HUGE));
  if (t == nullptr) {
    std::string().swap(s);
    ereport(ERROR, (errcode(ERRCODE_OUT_OF_MEMORY), errmsg("out of memory")));
  }
  SET_VARSIZE(t, VARHDRSZ + s.size());
  std::memcpy(VARDATA(t), s.data(), s.size());
  std::string().swap(s);
  return PointerGetDatum(t);
}

const char *text_arg(FunctionCallInfo fcinfo, int k) { return text_to_cstring(PG_GETARG_TEXT_PP(k)); }

}  // namespace

// ---- literal checks ---------------------------------------------------------------

STRIAE_FUNCTION(plane_input_error) { return check(fcinfo, Notation::Plane, text_arg(fcinfo, 0)); }
STRIAE_FUNCTION(lineation_input_error) { return check(fcinfo, Notation::Lineation, text_arg(fcinfo, 0)); }
STRIAE_FUNCTION(fault_slip_input_error) { return check(fcinfo, Notation::FaultSlip, text_arg(fcinfo, 0)); }
STRIAE_FUNCTION(stress_tensor_input_error) {
  return check(fcinfo, Notation::StressTensor, text_arg(fcinfo, 0));
}
STRIAE_FUNCTION(sphere_grid_input_error) { return check(fcinfo, Notation::SphereGrid, text_arg(fcinfo, 0)); }
STRIAE_FUNCTION(slip_sense_input_error) { return check(fcinfo, Notation::SlipSense, text_arg(fcinfo, 0)); }

// input_error(value text, notation text): the same for a notation named at run time.
STRIAE_FUNCTION(input_error) {
  const char *value = text_arg(fcinfo, 0);
  const char *name = text_arg(fcinfo, 1);
  const Notation kind = guarded([&] { return notation_named(name); });
  return check(fcinfo, kind, value);
}

// ---- field book -------------------------------------------------------------------

STRIAE_FUNCTION(field_fault_slip) {
  const char *s = text_arg(fcinfo, 0), *d = text_arg(fcinfo, 1), *r = text_arg(fcinfo, 2),
             *sense = text_arg(fcinfo, 3);
  return result(guarded([&] { return striae::field_fault_slip(s, d, r, sense); }));
}

STRIAE_FUNCTION(field_fault_slip_input_error) {
  const char *s = text_arg(fcinfo, 0), *d = text_arg(fcinfo, 1), *r = text_arg(fcinfo, 2),
             *sense = text_arg(fcinfo, 3);
  char reason[kReasonCap];
  const bool valid = guarded([&] { return check_field_fault_slip(s, d, r, sense, reason, sizeof reason); });
  if (valid) PG_RETURN_NULL();
  return reason_text(reason);
}

// ---- fixed-precision display ---------------------------------------------------------

namespace {
template <class T>
Datum to_text(FunctionCallInfo fcinfo) {
  const T v = *arg<T>(fcinfo, 0);
  const int decimals = PG_GETARG_INT32(1);
  std::string s = guarded([&] { return display(v, decimals); });
  return string_text(s);
}
}  // namespace

STRIAE_FUNCTION(plane_to_text) { return to_text<Plane>(fcinfo); }
STRIAE_FUNCTION(lineation_to_text) { return to_text<Line>(fcinfo); }
STRIAE_FUNCTION(fault_slip_to_text) { return to_text<FaultSlip>(fcinfo); }

STRIAE_FUNCTION(stress_tensor_to_text) {
  const StressTensor t = *arg<StressTensor>(fcinfo, 0);
  const int decimals = PG_GETARG_INT32(1);
  std::string s = guarded([&] {
    check_stress_tensor(t);
    return display(t, decimals);
  });
  return string_text(s);
}

STRIAE_FUNCTION(sphere_grid_to_text) {
  const GridDatum *g = grid_arg(fcinfo, 0);
  const int decimals = PG_GETARG_INT32(1);
  std::string s = guarded([&] {
    const GridKind kind = static_cast<GridKind>(g->kind);
    check_grid(kind, g->spacing, g->n, g->values, static_cast<size_t>(g->count));
    return display_grid(grid_kind_name(kind), g->spacing, g->n, g->values, static_cast<size_t>(g->count),
                        decimals);
  });
  return string_text(s);
}

// ---- screening many values at once -----------------------------------------------------

extern "C" {
#include "executor/spi.h"
#include "utils/rel.h"
}

namespace {

// One output row (line, value, reason) of input_errors.
void put_row(ReturnSetInfo *rsinfo, int64 line, bool line_null, const char *value, const char *reason) {
  Datum v[3] = {Int64GetDatum(line), CStringGetTextDatum(value), reason_text(reason)};
  bool nulls[3] = {line_null, false, false};
  tuplestore_putvalues(rsinfo->setResult, rsinfo->setDesc, v, nulls);
}

}  // namespace

// input_errors(vals text[], notation text) -> TABLE(line, value, reason): the
// elements of the array that are not valid literals, with their position
// (1-based, in storage order) and the reason. NULL elements are skipped.
STRIAE_FUNCTION(input_errors_array) {
  ArrayType *a = PG_GETARG_ARRAYTYPE_P(0);
  const char *name = text_arg(fcinfo, 1);
  const Notation kind = guarded([&] { return notation_named(name); });
  InitMaterializedSRF(fcinfo, 0);
  ReturnSetInfo *rsinfo = reinterpret_cast<ReturnSetInfo *>(fcinfo->resultinfo);
  Datum *elems;
  bool *nulls;
  int n;
  deconstruct_array(a, TEXTOID, -1, false, TYPALIGN_INT, &elems, &nulls, &n);
  char reason[kReasonCap];
  for (int i = 0; i < n; ++i) {
    if (nulls[i]) continue;
    if ((i & 1023) == 1023) CHECK_FOR_INTERRUPTS();
    const char *value = TextDatumGetCString(elems[i]);
    const bool valid = guarded([&] { return check_literal(kind, value, reason, sizeof reason); });
    if (!valid) put_row(rsinfo, i + 1, false, value, reason);
  }
  return (Datum)0;
}

// input_errors(tbl regclass, col name, notation text, line_col name DEFAULT NULL)
// -> TABLE(line, value, reason): the rows of a (staging) table whose column is
// not a valid literal. line is the value of line_col, or, without it, the
// row's position in the table's physical order (the file order of a table just
// filled by COPY). The query runs with the caller's privileges (SPI, security
// invoker), and the table and column names are quoted identifiers resolved
// from the regclass, so nothing of the arguments is spliced into SQL as code.
// Every type and function the query names is schema-qualified, so objects of
// the caller's search_path cannot stand in for them (sql/search_path.sql).
STRIAE_FUNCTION(input_errors_table) {
  if (PG_ARGISNULL(0) || PG_ARGISNULL(1) || PG_ARGISNULL(2)) PG_RETURN_NULL();
  const Oid rel = PG_GETARG_OID(0);
  const char *col = NameStr(*PG_GETARG_NAME(1));
  const char *name = text_arg(fcinfo, 2);
  const char *line_col = PG_ARGISNULL(3) ? nullptr : NameStr(*PG_GETARG_NAME(3));
  const Notation kind = guarded([&] { return notation_named(name); });

  const char *relname = get_rel_name(rel);
  if (relname == nullptr)
    ereport(ERROR, (errcode(ERRCODE_UNDEFINED_TABLE), errmsg("relation with OID %u does not exist", rel)));
  const char *qualified = quote_qualified_identifier(get_namespace_name(get_rel_namespace(rel)), relname);
  for (const char *c : {col, line_col}) {
    if (c != nullptr && get_attnum(rel, c) == InvalidAttrNumber)
      ereport(ERROR, (errcode(ERRCODE_UNDEFINED_COLUMN),
                      errmsg("column \"%s\" of relation \"%s\" does not exist", c, relname)));
  }
  StringInfoData q;
  initStringInfo(&q);
  if (line_col != nullptr)
    appendStringInfo(&q, "SELECT (%s)::pg_catalog.int8, (%s)::pg_catalog.text FROM %s WHERE %s IS NOT NULL ORDER BY 1",
                     quote_identifier(line_col), quote_identifier(col), qualified, quote_identifier(col));
  else
    appendStringInfo(&q,
                     "SELECT line, v FROM (SELECT pg_catalog.row_number() OVER (ORDER BY ctid) AS line, "
                     "(%s)::pg_catalog.text AS v FROM %s) s WHERE v IS NOT NULL ORDER BY line",
                     quote_identifier(col), qualified);

  InitMaterializedSRF(fcinfo, 0);
  ReturnSetInfo *rsinfo = reinterpret_cast<ReturnSetInfo *>(fcinfo->resultinfo);
  MemoryContext out_ctx = CurrentMemoryContext;
  if (SPI_connect() != SPI_OK_CONNECT) ereport(ERROR, (errmsg("SPI_connect failed")));
  SPIPlanPtr plan = SPI_prepare(q.data, 0, nullptr);
  if (plan == nullptr) ereport(ERROR, (errmsg("could not prepare the screening query: %s", SPI_result_code_string(SPI_result))));
  Portal portal = SPI_cursor_open(nullptr, plan, nullptr, nullptr, true);
  char reason[kReasonCap];
  for (;;) {
    SPI_cursor_fetch(portal, true, 1000);
    if (SPI_processed == 0) break;
    for (uint64 r = 0; r < SPI_processed; ++r) {
      HeapTuple tup = SPI_tuptable->vals[r];
      bool isnull;
      const Datum ld = SPI_getbinval(tup, SPI_tuptable->tupdesc, 1, &isnull);
      const int64 line = isnull ? 0 : DatumGetInt64(ld);
      const char *value = SPI_getvalue(tup, SPI_tuptable->tupdesc, 2);
      const bool valid = guarded([&] { return check_literal(kind, value, reason, sizeof reason); });
      if (!valid) {
        MemoryContext old = MemoryContextSwitchTo(out_ctx);
        put_row(rsinfo, line, isnull, value, reason);
        MemoryContextSwitchTo(old);
      }
    }
    SPI_freetuptable(SPI_tuptable);
    CHECK_FOR_INTERRUPTS();
  }
  SPI_cursor_close(portal);
  SPI_finish();
  return (Datum)0;
}
