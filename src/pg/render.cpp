// Figures: the net_figure type (text and binary I/O), the functions and
// aggregates that build layers, composition, and net_svg. All geometry and
// drawing is in src/core (figure, drawing, render); this file unpacks
// arguments, keeps aggregate data in PostgreSQL memory and returns text.
#include "agg.hpp"
#include "grid.hpp"

#include "../core/figure.hpp"
#include "../core/projection.hpp"
#include "../core/render.hpp"
#include "../core/stress.hpp"

extern "C" {
#include "mb/pg_wchar.h"
#include "utils/geo_decls.h"
}

#include <algorithm>

using namespace striae;
using namespace striae_pg;

namespace {

// ---- values ------------------------------------------------------------------------

// A varlena holding s (encoded figure bytes or text). The string is released
// before any error is raised, so an out-of-memory report leaks nothing.
Datum varlena_of(std::string &&s) {
  const Size size = VARHDRSZ + s.size();
  void *p = size <= MaxAllocSize ? palloc_extended(size, MCXT_ALLOC_NO_OOM) : nullptr;
  if (p == nullptr) {
    const Size want = s.size();
    std::string().swap(s);
    ereport(ERROR, (errcode(ERRCODE_PROGRAM_LIMIT_EXCEEDED), errmsg("figure result too large"),
                    errdetail("It would take %zu bytes.", static_cast<size_t>(want))));
  }
  SET_VARSIZE(p, size);
  std::memcpy(VARDATA(p), s.data(), s.size());
  std::string().swap(s);
  return PointerGetDatum(p);
}

struct Bytes {
  const char *data;
  size_t size;
};
Bytes figure_arg(FunctionCallInfo fcinfo, int k) {
  struct varlena *v = PG_DETOAST_DATUM_PACKED(PG_GETARG_DATUM(k));
  return Bytes{VARDATA_ANY(v), VARSIZE_ANY_EXHDR(v)};
}

// Text argument as UTF-8 (labels and titles are kept and drawn in UTF-8), in
// palloc'd memory: an entry function holds no C++ object of its own while a
// PostgreSQL error can still be raised (one would leak its heap memory on
// every error; tests/external/check_error_memory.py). The std::string is
// built inside the guarded lambda.
struct Utf8 {
  const char *p;
  size_t n;
  std::string str() const { return std::string(p, n); }
};
Utf8 utf8_arg(FunctionCallInfo fcinfo, int k) {
  text *t = PG_GETARG_TEXT_PP(k);
  const char *s = VARDATA_ANY(t);
  const int len = VARSIZE_ANY_EXHDR(t);
  char *u = pg_server_to_any(s, len, PG_UTF8);
  return Utf8{u, u == s ? static_cast<size_t>(len) : std::strlen(u)};
}

const char *utf8_cstring(const char *s) { return pg_server_to_any(s, std::strlen(s), PG_UTF8); }

Datum one_layer(LayerKind kind, std::vector<double> params, std::vector<double> data) {
  std::string bytes = guarded([&] {
    Figure f;
    f.layers.push_back(Layer{kind, std::string(), std::move(params), std::move(data)});
    check_figure(f);
    return encode_figure(f);
  });
  return varlena_of(std::move(bytes));
}

}  // namespace

// ---- type I/O -----------------------------------------------------------------------------

STRIAE_FUNCTION(net_figure_in) {
  const char *text = utf8_cstring(PG_GETARG_CSTRING(0));
  std::string bytes = guarded([&] { return encode_figure(figure_from_text(text)); });
  return varlena_of(std::move(bytes));
}

STRIAE_FUNCTION(net_figure_out) {
  const Bytes b = figure_arg(fcinfo, 0);
  std::string text = guarded([&] { return figure_to_text(decode_figure(b.data, b.size)); });
  // The conversion may raise (a label with a character the server encoding
  // lacks): release the C++ string first.
  char *utf8 = pnstrdup(text.data(), text.size());
  const int len = static_cast<int>(text.size());
  std::string().swap(text);
  PG_RETURN_CSTRING(pg_any_to_server(utf8, len, PG_UTF8));
}

// Binary form: the stored bytes (portable: big-endian, versioned), checked on receipt.
STRIAE_FUNCTION(net_figure_recv) {
  StringInfo buf = reinterpret_cast<StringInfo>(PG_GETARG_POINTER(0));
  const char *p = buf->data + buf->cursor;
  const size_t n = static_cast<size_t>(buf->len - buf->cursor);
  buf->cursor = buf->len;
  std::string bytes = guarded([&] { return encode_figure(decode_figure(p, n)); });
  return varlena_of(std::move(bytes));
}

STRIAE_FUNCTION(net_figure_send) {
  const Bytes b = figure_arg(fcinfo, 0);
  StringInfoData buf;
  pq_begintypsend(&buf);
  pq_sendbytes(&buf, b.data, static_cast<int>(b.size));
  PG_RETURN_BYTEA_P(pq_endtypsend(&buf));
}

// ---- layers built by functions ---------------------------------------------------------------

STRIAE_FUNCTION(net_mechanism) {
  const FaultSlip f = *arg<FaultSlip>(fcinfo, 0);
  return one_layer(LayerKind::Mechanism, {}, {f.strike, f.dip, f.rake});
}

STRIAE_FUNCTION(net_cone) {
  const Line l = *arg<Line>(fcinfo, 0);
  const double h = PG_GETARG_FLOAT8(1);
  if (!(h > 0 && h <= 90))
    ereport(ERROR, (errcode(ERRCODE_NUMERIC_VALUE_OUT_OF_RANGE), errmsg("cone half-angle must be greater than 0 and at most 90 degrees"),
                    errdetail("An axis is never more than 90 degrees from another, so a cone of 90 degrees covers the whole net.")));
  return one_layer(LayerKind::Cones, {}, {l.trend, l.plunge, h});
}

STRIAE_FUNCTION(net_stress) {
  const StressTensor t = *arg<StressTensor>(fcinfo, 0);
  guarded([&] { check_stress_tensor(t); });
  const double *f = &t.nn;
  std::vector<double> params(f, f + 13);
  params.push_back(static_cast<double>(t.data_count));
  params.push_back(static_cast<double>(t.flags));
  return one_layer(LayerKind::Stress, std::move(params), {});
}

// net_contours(sphere_grid, levels float8[], filled boolean): levels NULL = automatic.
STRIAE_FUNCTION(net_contours) {
  if (PG_ARGISNULL(0)) PG_RETURN_NULL();
  const GridDatum *g = grid_arg(fcinfo, 0);
  const bool filled = PG_ARGISNULL(2) ? true : PG_GETARG_BOOL(2);
  // The levels are checked before any C++ object exists in this frame: an
  // ereport here must not skip a destructor (a vector leaked on every error).
  Datum *elems = nullptr;
  bool *nulls = nullptr;
  int n = 0;
  if (!PG_ARGISNULL(1)) {
    ArrayType *a = PG_GETARG_ARRAYTYPE_P(1);
    deconstruct_array(a, FLOAT8OID, sizeof(float8), FLOAT8PASSBYVAL, TYPALIGN_DOUBLE, &elems, &nulls, &n);
    if (n == 0 || n > static_cast<int>(kMaxContourLevels))
      ereport(ERROR, (errcode(ERRCODE_INVALID_PARAMETER_VALUE), errmsg("contour levels: give 1 to %d levels, or NULL for automatic levels",
                                                                      static_cast<int>(kMaxContourLevels))));
    for (int i = 0; i < n; ++i) {
      if (nulls[i]) ereport(ERROR, (errcode(ERRCODE_NULL_VALUE_NOT_ALLOWED), errmsg("contour levels must not contain NULL")));
      const double v = DatumGetFloat8(elems[i]);
      if (!std::isfinite(v)) ereport(ERROR, (errcode(ERRCODE_INVALID_PARAMETER_VALUE), errmsg("contour levels must be finite")));
    }
  }
  std::vector<double> params = {static_cast<double>(g->kind), g->spacing, static_cast<double>(g->n), filled ? 1.0 : 0.0};
  for (int i = 0; i < n; ++i) params.push_back(DatumGetFloat8(elems[i]));
  return one_layer(LayerKind::Contours, std::move(params), std::vector<double>(g->values, g->values + g->count));
}

STRIAE_FUNCTION(net_label) {
  const Bytes b = figure_arg(fcinfo, 0);
  const Utf8 label_arg = utf8_arg(fcinfo, 1);
  std::string bytes = guarded([&] {
    const std::string label = label_arg.str();
    check_label(label);
    Figure f = decode_figure(b.data, b.size);
    for (Layer &l : f.layers) l.label = label;
    return encode_figure(f);
  });
  return varlena_of(std::move(bytes));
}

STRIAE_FUNCTION(net_figure_concat) {
  const Bytes a = figure_arg(fcinfo, 0), b = figure_arg(fcinfo, 1);
  std::string bytes = guarded([&] { return encode_figure(concat_figures(decode_figure(a.data, a.size), decode_figure(b.data, b.size))); });
  return varlena_of(std::move(bytes));
}

// net_xy(lineation, projection text) -> point in the unit disc (x east, y north).
STRIAE_FUNCTION(net_xy) {
  const Line l = *arg<Line>(fcinfo, 0);
  const Utf8 name = utf8_arg(fcinfo, 1);
  const XY p = guarded([&] { return project(line_vector(l), parse_projection(name.str())); });
  Point *out = static_cast<Point *>(palloc(sizeof(Point)));
  out->x = p.x;
  out->y = p.y;
  PG_RETURN_POINTER(out);
}

// net_svg(figure, projection, size, title, graticule, legend) -> text
STRIAE_FUNCTION(net_svg) {
  const Bytes b = figure_arg(fcinfo, 0);
  const Utf8 proj = utf8_arg(fcinfo, 1);
  const int32 size = PG_GETARG_INT32(2);
  const Utf8 title = utf8_arg(fcinfo, 3);
  const bool graticule = PG_GETARG_BOOL(4), legend = PG_GETARG_BOOL(5);
  std::string svg = guarded([&] {
    RenderOptions o;
    o.size = size;
    o.title = title.str();
    o.graticule = graticule;
    o.legend = legend;
    o.projection = parse_projection(proj.str());
    return render_svg(decode_figure(b.data, b.size), o);
  });
  return varlena_of(std::move(svg));  // plain ASCII: valid text in every server encoding
}

// ---- aggregates that keep a layer's data ----------------------------------------------------------
//
// State: the layer kind and a growing array of item numbers in the aggregate
// context (at most kMaxFigureItems items: 2.4 MB). Combine concatenates; the
// final function sorts the items, so the layer depends only on the set of data,
// not on row order or on a parallel plan. NULL rows are skipped; an empty
// group gives NULL.

namespace {

constexpr uint32 kNetMagic = 0x534e4c31;  // "SNL1"

struct NetAgg {
  StateTag tag;  // StateKind::FigureLayer (agg_state.hpp)
  int32 kind;
  int32 width;
  int64 count;
  int64 cap;
  double *data;
};
static_assert(std::is_trivially_destructible<NetAgg>::value, "palloc'd state");

NetAgg *net_new(MemoryContext ctx, LayerKind kind, int64 cap) {
  NetAgg *a = static_cast<NetAgg *>(MemoryContextAlloc(ctx, sizeof(NetAgg)));
  a->tag = state_tag(StateKind::FigureLayer);
  a->kind = static_cast<int32>(kind);
  a->width = layer_item_width(kind);
  a->count = 0;
  a->cap = Max(cap, 64);
  a->data = static_cast<double *>(MemoryContextAlloc(ctx, sizeof(double) * a->width * a->cap));
  return a;
}

void net_reserve(NetAgg *a, int64 need) {
  if (need > static_cast<int64>(kMaxFigureItems))
    ereport(ERROR, (errcode(ERRCODE_INVALID_PARAMETER_VALUE), errmsg("too many data for one figure layer"),
                    errdetail("A figure holds at most %d drawn data.", static_cast<int>(kMaxFigureItems)),
                    errhint("Draw a sample, or split the group.")));
  if (need <= a->cap) return;
  int64 cap = a->cap;
  while (cap < need) cap *= 2;
  cap = Min(cap, static_cast<int64>(kMaxFigureItems));
  a->data = static_cast<double *>(repalloc(a->data, sizeof(double) * a->width * cap));
  a->cap = cap;
}

Datum net_accum(FunctionCallInfo fcinfo, LayerKind kind, const char *fn) {
  NetAgg *a = state_arg<NetAgg>(fcinfo, 0, fn, StateKind::FigureLayer);
  if (a == nullptr) a = net_new(agg_context(fcinfo, fn), kind, 64);
  if (a->kind != static_cast<int32>(kind))
    ereport(ERROR, (errcode(ERRCODE_DATA_EXCEPTION), errmsg("%s: handed the state of another figure layer aggregate", fn)));
  if (!PG_ARGISNULL(1)) {
    net_reserve(a, a->count + 1);
    const double *v = reinterpret_cast<const double *>(PG_GETARG_POINTER(1));
    std::memcpy(a->data + a->width * a->count, v, sizeof(double) * a->width);
    ++a->count;
  }
  PG_RETURN_POINTER(a);
}

NetAgg *net_state(FunctionCallInfo fcinfo, int k, const char *fn) {
  return state_arg<NetAgg>(fcinfo, k, fn, StateKind::FigureLayer);
}

// Throws unless a is a well-formed state (what a layer of its kind accepts).
void net_validate(const NetAgg *a) {
  guarded([&] {
    const LayerKind k = static_cast<LayerKind>(a->kind);
    if (a->kind < 1 || a->kind > kLayerKindCount || layer_item_width(k) == 0 || a->width != layer_item_width(k) ||
        k == LayerKind::Mechanism || a->count < 0 || a->count > a->cap || a->count > static_cast<int64>(kMaxFigureItems))
      throw Error(ErrorKind::BadState, "invalid figure layer state");
    Layer l{k, std::string(), {}, std::vector<double>(a->data, a->data + a->width * a->count)};
    check_layer(l);
  });
}

}  // namespace

STRIAE_FUNCTION(net_great_circles_accum) { return net_accum(fcinfo, LayerKind::GreatCircles, "net_great_circles_accum"); }
STRIAE_FUNCTION(net_poles_accum) { return net_accum(fcinfo, LayerKind::Poles, "net_poles_accum"); }
STRIAE_FUNCTION(net_lines_accum) { return net_accum(fcinfo, LayerKind::Lines, "net_lines_accum"); }
STRIAE_FUNCTION(net_faults_accum) { return net_accum(fcinfo, LayerKind::SlipPlanes, "net_faults_accum"); }
STRIAE_FUNCTION(net_hoeppener_accum) { return net_accum(fcinfo, LayerKind::SlipPoles, "net_hoeppener_accum"); }
STRIAE_FUNCTION(net_pt_axes_accum) { return net_accum(fcinfo, LayerKind::PTAxes, "net_pt_axes_accum"); }
STRIAE_FUNCTION(net_dihedra_accum) { return net_accum(fcinfo, LayerKind::PDihedra, "net_dihedra_accum"); }

STRIAE_FUNCTION(net_layer_combine) {
  MemoryContext ctx = agg_context(fcinfo, "net_layer_combine");
  NetAgg *a = net_state(fcinfo, 0, "net_layer_combine"), *b = net_state(fcinfo, 1, "net_layer_combine");
  if (b == nullptr) {
    if (a == nullptr) PG_RETURN_NULL();
    PG_RETURN_POINTER(a);
  }
  net_validate(b);
  if (a == nullptr) {
    a = net_new(ctx, static_cast<LayerKind>(b->kind), b->count);
  } else {
    net_validate(a);
    if (a->kind != b->kind)
      ereport(ERROR, (errcode(ERRCODE_DATA_EXCEPTION), errmsg("net_layer_combine: states of different aggregates")));
  }
  net_reserve(a, a->count + b->count);
  std::memcpy(a->data + a->width * a->count, b->data, sizeof(double) * b->width * b->count);
  a->count += b->count;
  PG_RETURN_POINTER(a);
}

STRIAE_FUNCTION(net_layer_serialize) {
  agg_context(fcinfo, "net_layer_serialize");
  const NetAgg *a = net_state(fcinfo, 0, "net_layer_serialize");
  net_validate(a);
  const Size payload = sizeof(double) * a->width * a->count;
  const Size size = VARHDRSZ + 16 + payload;
  bytea *out = static_cast<bytea *>(palloc(size));
  SET_VARSIZE(out, size);
  char *p = VARDATA(out);
  std::memcpy(p, &kNetMagic, 4);
  std::memcpy(p + 4, &a->kind, 4);
  std::memcpy(p + 8, &a->count, 8);
  std::memcpy(p + 16, a->data, payload);
  PG_RETURN_BYTEA_P(out);
}

STRIAE_FUNCTION(net_layer_deserialize) {
  MemoryContext ctx = agg_context(fcinfo, "net_layer_deserialize");
  bytea *in = PG_GETARG_BYTEA_PP(0);
  const Size len = VARSIZE_ANY_EXHDR(in);
  const char *p = VARDATA_ANY(in);
  uint32 magic = 0;
  int32 kind = 0;
  int64 count = -1;
  if (len >= 16) {
    std::memcpy(&magic, p, 4);
    std::memcpy(&kind, p + 4, 4);
    std::memcpy(&count, p + 8, 8);
  }
  const int width = kind >= 1 && kind <= kLayerKindCount ? layer_item_width(static_cast<LayerKind>(kind)) : 0;
  if (magic != kNetMagic || width == 0 || count < 0 || count > static_cast<int64>(kMaxFigureItems) ||
      len != 16 + sizeof(double) * width * static_cast<Size>(count))
    ereport(ERROR, (errcode(ERRCODE_DATA_EXCEPTION), errmsg("net_layer_deserialize: not a serialized state of this aggregate")));
  NetAgg *a = net_new(ctx, static_cast<LayerKind>(kind), count);
  std::memcpy(a->data, p + 16, sizeof(double) * width * count);
  a->count = count;
  net_validate(a);
  PG_RETURN_POINTER(a);
}

STRIAE_FUNCTION(net_layer_final) {
  const NetAgg *a = net_state(fcinfo, 0, "net_layer_final");
  if (a == nullptr || a->count == 0) PG_RETURN_NULL();
  net_validate(a);
  std::string bytes = guarded([&] {
    Figure f;
    f.layers.push_back(Layer{static_cast<LayerKind>(a->kind), std::string(), {},
                             std::vector<double>(a->data, a->data + a->width * a->count)});
    sort_items(f.layers[0]);
    check_figure(f);
    return encode_figure(f);
  });
  return varlena_of(std::move(bytes));
}

// ---- net_stack(net_figure): all layers of the group in one figure -------------------------------
//
// State: the encoded figures one after another, each with a 4-byte length, in a
// growing buffer (bounded by the figure limits). The final function orders the
// layers by kind, label and content, so the result does not depend on row order.

namespace {

constexpr uint32 kStackMagic = 0x534e5331;  // "SNS1"

struct StackAgg {
  StateTag tag;  // StateKind::FigureStack (agg_state.hpp)
  int64 used;
  int64 cap;
  char *buf;
};
static_assert(std::is_trivially_destructible<StackAgg>::value, "palloc'd state");

StackAgg *stack_new(MemoryContext ctx, int64 cap) {
  StackAgg *a = static_cast<StackAgg *>(MemoryContextAlloc(ctx, sizeof(StackAgg)));
  a->tag = state_tag(StateKind::FigureStack);
  a->used = 0;
  a->cap = Max(cap, 1024);
  a->buf = static_cast<char *>(MemoryContextAlloc(ctx, a->cap));
  return a;
}

void stack_append(StackAgg *a, const char *p, int64 n) {
  if (a->used + n > a->cap) {
    int64 cap = a->cap;
    while (cap < a->used + n) cap *= 2;
    if (cap > static_cast<int64>(MaxAllocSize))
      ereport(ERROR, (errcode(ERRCODE_INVALID_PARAMETER_VALUE), errmsg("too many data for one figure")));
    a->buf = static_cast<char *>(repalloc(a->buf, cap));
    a->cap = cap;
  }
  std::memcpy(a->buf + a->used, p, n);
  a->used += n;
}

StackAgg *stack_state(FunctionCallInfo fcinfo, int k, const char *fn) {
  return state_arg<StackAgg>(fcinfo, k, fn, StateKind::FigureStack);
}

// All layers of the buffer (each piece checked), limits applied to the sum.
Figure stack_figure(const char *buf, int64 used) {
  Figure all;
  int64 at = 0;
  while (at < used) {
    poll_interrupts();
    uint32_t n;
    if (used - at < 4) throw Error(ErrorKind::BadState, "invalid net_stack state");
    std::memcpy(&n, buf + at, 4);
    if (static_cast<int64>(n) > used - at - 4) throw Error(ErrorKind::BadState, "invalid net_stack state");
    all = concat_figures(all, decode_figure(buf + at + 4, n));
    at += 4 + n;
  }
  return all;
}

}  // namespace

STRIAE_FUNCTION(net_stack_accum) {
  StackAgg *a = stack_state(fcinfo, 0, "net_stack_accum");
  if (a == nullptr) a = stack_new(agg_context(fcinfo, "net_stack_accum"), 1024);
  if (!PG_ARGISNULL(1)) {
    const Bytes b = figure_arg(fcinfo, 1);
    const uint32 n = static_cast<uint32>(b.size);
    stack_append(a, reinterpret_cast<const char *>(&n), 4);
    stack_append(a, b.data, static_cast<int64>(b.size));
  }
  PG_RETURN_POINTER(a);
}

STRIAE_FUNCTION(net_stack_combine) {
  MemoryContext ctx = agg_context(fcinfo, "net_stack_combine");
  StackAgg *a = stack_state(fcinfo, 0, "net_stack_combine"), *b = stack_state(fcinfo, 1, "net_stack_combine");
  if (b == nullptr) {
    if (a == nullptr) PG_RETURN_NULL();
    PG_RETURN_POINTER(a);
  }
  if (a == nullptr) a = stack_new(ctx, b->used);
  stack_append(a, b->buf, b->used);
  PG_RETURN_POINTER(a);
}

STRIAE_FUNCTION(net_stack_serialize) {
  agg_context(fcinfo, "net_stack_serialize");
  const StackAgg *a = stack_state(fcinfo, 0, "net_stack_serialize");
  const Size size = VARHDRSZ + 4 + a->used;
  bytea *out = static_cast<bytea *>(palloc(size));
  SET_VARSIZE(out, size);
  std::memcpy(VARDATA(out), &kStackMagic, 4);
  std::memcpy(VARDATA(out) + 4, a->buf, a->used);
  PG_RETURN_BYTEA_P(out);
}

STRIAE_FUNCTION(net_stack_deserialize) {
  MemoryContext ctx = agg_context(fcinfo, "net_stack_deserialize");
  bytea *in = PG_GETARG_BYTEA_PP(0);
  const Size len = VARSIZE_ANY_EXHDR(in);
  uint32 magic = 0;
  if (len >= 4) std::memcpy(&magic, VARDATA_ANY(in), 4);
  if (magic != kStackMagic)
    ereport(ERROR, (errcode(ERRCODE_DATA_EXCEPTION), errmsg("net_stack_deserialize: not a serialized state of this aggregate")));
  StackAgg *a = stack_new(ctx, len);
  stack_append(a, VARDATA_ANY(in) + 4, len - 4);
  guarded([&] { stack_figure(a->buf, a->used); });  // validate every piece
  PG_RETURN_POINTER(a);
}

STRIAE_FUNCTION(net_stack_final) {
  const StackAgg *a = stack_state(fcinfo, 0, "net_stack_final");
  if (a == nullptr || a->used == 0) PG_RETURN_NULL();
  std::string bytes = guarded([&] {
    Figure f = stack_figure(a->buf, a->used);
    std::vector<std::pair<std::string, size_t>> keys;
    for (size_t i = 0; i < f.layers.size(); ++i) {
      Figure one;
      one.layers.push_back(f.layers[i]);
      keys.push_back({encode_figure(one), i});
    }
    // Order: kind, then label, then content (the encoded bytes start with the
    // header, then the kind byte, the label length and the label).
    std::sort(keys.begin(), keys.end(), [&](const auto &x, const auto &y) {
      const Layer &lx = f.layers[x.second], &ly = f.layers[y.second];
      if (lx.kind != ly.kind) return lx.kind < ly.kind;
      if (lx.label != ly.label) return lx.label < ly.label;
      return x.first < y.first;
    });
    Figure out;
    for (const auto &k : keys) out.layers.push_back(f.layers[k.second]);
    return encode_figure(out);
  });
  return varlena_of(std::move(bytes));
}
