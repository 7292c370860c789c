// Slip-sense strings and fault_slip(plane, lineation, sense, tolerance)
// (fault_slip_from_striation -> parse_sense, fault_from_striation).
// Input: strike, dip, trend, plunge, tolerance as five raw float8 (only
// values the SQL types accept go on), then the sense text. Invariants on an
// accepted call: the fault is canonical; its slip lies along the striation
// (axially, within the tolerance); and its hanging-wall slip has the sense
// asked for (normal: down, reverse: up, sinistral: along strike, dextral:
// against it).
#include "fuzz.hpp"
#include "orientation.hpp"

using namespace striae;

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size) {
  fuzz::Bytes in{data, size};
  const double strike = in.get<double>(), dip = in.get<double>(), trend = in.get<double>(),
               plunge = in.get<double>(), tol = in.get<double>();
  const std::string text = fuzz::as_text(data + (size - in.left()), in.left());
  Sense sense;
  try {
    sense = parse_sense(text);
  } catch (const Error &) {
    return 0;
  }
  FUZZ_CHECK(sense.dip != 0 || sense.strike != 0, text);
  Plane p;
  Line l;
  try {
    p = make_plane(strike, dip);
    l = make_line(trend, plunge);
  } catch (const Error &) {
    return 0;  // not values of the SQL types
  }
  FaultSlip f;
  try {
    f = fault_from_striation(p, line_vector(l), sense, tol);
  } catch (const Error &) {
    return 0;
  }
  const std::string what = fuzz::num(p.strike) + "/" + fuzz::num(p.dip) + " " + fuzz::num(l.trend) + "/" +
                           fuzz::num(l.plunge) + " '" + text + "' tol " + fuzz::num(tol);
  FUZZ_CHECK(is_canonical(f), what);
  Vec3 n, u;
  fault_vectors(f, n, u);
  const Vec3 lv = line_vector(l);
  // The slip is the striation projected onto the plane: its axial angle to the
  // striation is the striation's angle off the plane, at most the tolerance.
  FUZZ_CHECK(axial_angle(u, lv) <= tol + 1e-6, what);
  // Senses are relative to the strike of the plane as given (the result of a
  // nearly horizontal plane may be canonicalised to strike 0), and checked
  // only where the component is clearly not zero (fault_from_vectors snaps
  // angles to 1e-10 degree).
  const Vec3 s = strike_vector(p.strike);
  if (sense.dip != 0 && std::fabs(u.z()) > 1e-6) FUZZ_CHECK((u.z() > 0) == (sense.dip > 0), what);
  if (sense.strike != 0 && std::fabs(u.dot(s)) > 1e-6) FUZZ_CHECK((u.dot(s) > 0) == (sense.strike > 0), what);
  return 0;
}
