// stress_tensor text input (stress_tensor_in -> parse_stress_tensor, then
// check_stress_tensor). Invariant on an accepted literal: the text that
// stress_tensor_out prints for it (numbers shortest round-trip) is accepted
// and gives the same value.
#include "fuzz.hpp"
#include "stress_text.hpp"

using namespace striae;

namespace {

StressTensor read(const char *s) {
  StressTensor t = parse_stress_tensor(s);
  check_stress_tensor(t);
  return t;
}

std::string list(const double *v, int n) {
  std::string s = "[";
  for (int i = 0; i < n; ++i) s += (i ? ", " : "") + fuzz::num(v[i]);
  return s + "]";
}

// The "flags" entry as stress_tensor_out prints it (flags in bit order).
std::string flag_list(uint32_t flags) {
  const struct {
    uint32_t bit;
    const char *name;
  } names[] = {{kStressFocalJoint, kStressFlagFocal},
               {kStressNotConverged, kStressFlagNotConverged},
               {kStressFrictionAtLimit, kStressFlagFrictionAtLimit}};
  std::string s;
  for (const auto &f : names)
    if (flags & f.bit) s += (s.empty() ? "" : ", ") + std::string("\"") + f.name + "\"";
  return s.empty() ? s : ", \"flags\": [" + s + "]";
}

// As stress_tensor_out (src/pg/stress.cpp) prints it.
std::string print(const StressTensor &t) {
  const double c[6] = {t.nn, t.ee, t.dd, t.ne, t.nd, t.ed};
  std::string s = "{\"components\": " + list(c, 6) + ", \"n\": " + std::to_string(t.data_count);
  if (t.flags & kStressHasMisfit) s += ", \"misfit\": " + fuzz::num(t.mean_misfit);
  if (t.flags & kStressHasCones) s += ", \"cones\": " + list(t.cone, 3);
  if (t.flags & kStressHasPhiInterval) {
    const double v[2] = {t.phi_lo, t.phi_hi};
    s += ", \"phi_interval\": " + list(v, 2);
  }
  if (t.flags & kStressHasFriction) s += ", \"friction\": " + fuzz::num(t.friction);
  s += flag_list(t.flags);
  return s + "}";
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size) {
  const std::string text = fuzz::as_text(data, size);
  StressTensor t;
  try {
    t = read(text.c_str());
  } catch (const Error &) {
    return 0;
  }
  const std::string out = print(t);
  StressTensor u;
  try {
    u = read(out.c_str());
  } catch (const Error &e) {
    fuzz::fail("printed text rejected", out + ": " + e.what());
  }
  FUZZ_CHECK(std::memcmp(&t, &u, sizeof t) == 0, text + " -> " + out);
  return 0;
}
