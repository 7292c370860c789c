// Binary input of the SQL types (plane_recv, lineation_recv, fault_slip_recv,
// stress_tensor_recv, sphere_grid_recv). The first input byte picks the type;
// the rest is the wire message, read as the glue reads it (version byte, then
// big-endian fields; the server rejects a message with bytes left over) and
// validated by the same src/core functions. Invariants on an accepted value:
// it is canonical (what binary input accepts, text output prints and text
// input reads back to the same value: binary and text accept the same set).
#include "fuzz.hpp"
#include "grid.hpp"
#include "parse.hpp"
#include "stress_text.hpp"

using namespace striae;

namespace {

struct Message {
  fuzz::Bytes b;
  bool ok = true;
  template <class T>
  T get() {
    if (b.left() < sizeof(T)) ok = false;
    return b.get_be<T>();
  }
  double f8() {
    const uint64_t bits = get<uint64_t>();
    double v;
    std::memcpy(&v, &bits, 8);
    return v;
  }
  bool finished() const { return ok && b.left() == 0; }
};

std::string pair(double a, double b) { return fuzz::num(a) + "/" + fuzz::num(b); }

void plane(Message &m) {
  const double s = m.f8(), d = m.f8();
  if (!m.finished()) return;
  Plane p;
  try {
    p = make_plane(s, d);
  } catch (const Error &) {
    return;
  }
  FUZZ_CHECK(is_canonical(p), pair(s, d));
  const Plane q = parse_plane(pair(p.strike, p.dip).c_str());
  FUZZ_CHECK(fuzz::same_bits(p.strike, q.strike) && fuzz::same_bits(p.dip, q.dip), pair(s, d));
}

void line(Message &m) {
  const double t = m.f8(), pl = m.f8();
  if (!m.finished()) return;
  Line l;
  try {
    l = make_line(t, pl);
  } catch (const Error &) {
    return;
  }
  FUZZ_CHECK(is_canonical(l), pair(t, pl));
  const Line q = parse_line(pair(l.trend, l.plunge).c_str());
  FUZZ_CHECK(fuzz::same_bits(l.trend, q.trend) && fuzz::same_bits(l.plunge, q.plunge), pair(t, pl));
}

void fault(Message &m) {
  const double s = m.f8(), d = m.f8(), r = m.f8();
  if (!m.finished()) return;
  FaultSlip f;
  try {
    f = make_fault_slip(s, d, r);
  } catch (const Error &) {
    return;
  }
  const std::string what = pair(s, d) + "/" + fuzz::num(r);
  FUZZ_CHECK(is_canonical(f), what);
  const FaultSlip g = parse_fault_slip((pair(f.strike, f.dip) + "/" + fuzz::num(f.rake)).c_str());
  FUZZ_CHECK(fuzz::same_bits(f.strike, g.strike) && fuzz::same_bits(f.dip, g.dip) && fuzz::same_bits(f.rake, g.rake),
             what);
}

std::string list(const double *v, int n) {
  std::string s = "[";
  for (int i = 0; i < n; ++i) s += (i ? ", " : "") + fuzz::num(v[i]);
  return s + "]";
}

void tensor(Message &m) {
  StressTensor t{};
  double *f[13] = {&t.nn, &t.ee, &t.dd, &t.ne, &t.nd, &t.ed, &t.mean_misfit,
                   &t.cone[0], &t.cone[1], &t.cone[2], &t.phi_lo, &t.phi_hi, &t.friction};
  for (double *p : f) *p = m.f8();
  t.data_count = m.get<int64_t>();
  t.flags = m.get<uint32_t>();
  t.version = kStressTensorVersion;
  if (!m.finished()) return;
  try {
    clear_negative_zeros(t);  // as stress_tensor_recv
    check_stress_tensor(t);
  } catch (const Error &) {
    return;
  }
  // The text of stress_tensor_out, read back (only defined fields are printed).
  const double c[6] = {t.nn, t.ee, t.dd, t.ne, t.nd, t.ed};
  std::string s = "{\"components\": " + list(c, 6) + ", \"n\": " + std::to_string(t.data_count);
  if (t.flags & kStressHasMisfit) s += ", \"misfit\": " + fuzz::num(t.mean_misfit);
  if (t.flags & kStressHasCones) s += ", \"cones\": " + list(t.cone, 3);
  if (t.flags & kStressHasPhiInterval) s += ", \"phi_interval\": [" + fuzz::num(t.phi_lo) + ", " + fuzz::num(t.phi_hi) + "]";
  if (t.flags & kStressHasFriction) s += ", \"friction\": " + fuzz::num(t.friction);
  {
    const struct {
      uint32_t bit;
      const char *name;
    } names[] = {{kStressFocalJoint, kStressFlagFocal},
                 {kStressNotConverged, kStressFlagNotConverged},
                 {kStressFrictionAtLimit, kStressFlagFrictionAtLimit}};
    std::string fl;
    for (const auto &f : names)
      if (t.flags & f.bit) fl += (fl.empty() ? "" : ", ") + std::string("\"") + f.name + "\"";
    if (!fl.empty()) s += ", \"flags\": [" + fl + "]";
  }
  s += "}";
  StressTensor u;
  try {
    u = parse_stress_tensor(s.c_str());
    check_stress_tensor(u);
  } catch (const Error &e) {
    fuzz::fail("binary-accepted stress_tensor rejected as text", s + ": " + e.what());
  }
  // Values compare equal (an undefined field is 0 or -0; both print as nothing).
  const double a[13] = {t.nn, t.ee, t.dd, t.ne, t.nd, t.ed, t.mean_misfit, t.cone[0], t.cone[1], t.cone[2],
                        t.phi_lo, t.phi_hi, t.friction};
  const double b[13] = {u.nn, u.ee, u.dd, u.ne, u.nd, u.ed, u.mean_misfit, u.cone[0], u.cone[1], u.cone[2],
                        u.phi_lo, u.phi_hi, u.friction};
  // Bit for bit: neither input keeps a -0, so the stored bytes are the same.
  for (int i = 0; i < 13; ++i) FUZZ_CHECK(fuzz::same_bits(a[i], b[i]), s);
  FUZZ_CHECK(t.data_count == u.data_count && t.flags == u.flags, s);
}

void grid(Message &m) {
  const int32_t kind = m.get<int32_t>();
  const double raw_spacing = m.f8();
  const int64_t n = m.get<int64_t>();
  const int32_t count = m.get<int32_t>();
  if (!m.ok) return;
  int expected;
  double spacing;
  try {
    spacing = grid_spacing(raw_spacing);  // as sphere_grid_recv: snapped as text input snaps it
    expected = grid_node_count(spacing);
  } catch (const Error &) {
    return;
  }
  if (count != expected) return;  // the glue rejects before allocating
  std::vector<double> values(static_cast<size_t>(count));
  for (double &v : values) v = m.f8();
  if (!m.finished()) return;
  try {
    check_grid(static_cast<GridKind>(kind), spacing, n, values.data(), values.size());
  } catch (const Error &) {
    return;
  }
  std::string s = std::string("{\"kind\": \"") + grid_kind_name(static_cast<GridKind>(kind)) +
                  "\", \"spacing\": " + fuzz::num(spacing) + ", \"n\": " + std::to_string(n) + ", \"values\": [";
  for (size_t k = 0; k < values.size(); ++k) s += (k ? ", " : "") + fuzz::num(values[k]);
  s += "]}";
  try {
    const GridHeader h = parse_grid_header(s.c_str());
    std::vector<double> back(values.size());
    FUZZ_CHECK(static_cast<size_t>(grid_node_count(h.spacing)) == values.size(), s.substr(0, 120));
    parse_grid_values(s.c_str(), h.values_at, back.data(), back.size());
    FUZZ_CHECK(static_cast<int32_t>(h.kind) == kind && fuzz::same_bits(h.spacing, spacing) && h.n == n &&
                   std::memcmp(back.data(), values.data(), sizeof(double) * values.size()) == 0,
               s.substr(0, 120));
  } catch (const Error &e) {
    fuzz::fail("binary-accepted sphere_grid rejected as text", s.substr(0, 120) + ": " + e.what());
  }
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size) {
  if (size < 2) return 0;
  Message m{fuzz::Bytes{data + 1, size - 1}};
  if (m.get<uint8_t>() != 1) return 0;  // wire format version
  switch (data[0] % 5) {
    case 0: plane(m); break;
    case 1: line(m); break;
    case 2: fault(m); break;
    case 3: tensor(m); break;
    case 4: grid(m); break;
  }
  return 0;
}
