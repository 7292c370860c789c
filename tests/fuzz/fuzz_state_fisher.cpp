// fisher_mean's serialized state (fisher_deserialize -> read_fisher_state).
// Invariants on an accepted state: it serializes back to the same bytes, and
// the final function's values are defined as documented (mean canonical, R in
// [0, n], kappa > 0, alpha95 in [0, 180]), for the state and for the state
// combined with itself (as a parallel plan would combine it) when that
// combination is valid. The combination itself may be rejected: validation
// allows rounding slack of 1e-9 (n + 1), which is not closed under addition
// for a crafted state on the very edge of it; real data are ~1e-16 inside.
#include "agg_state.hpp"
#include "state_checks.hpp"

using namespace striae;

namespace {

void check_final(const FisherState &s) {
  FisherResult r;
  try {
    r = fisher_result(s);
  } catch (const Error &) {
    return;
  }
  FUZZ_CHECK(r.n == s.tensor.n, "n");
  if (r.mean_valid)
    FUZZ_CHECK(is_canonical(r.mean), "mean " + fuzz::num(r.mean.trend) + "/" + fuzz::num(r.mean.plunge));
  FUZZ_CHECK(std::isfinite(r.resultant) && r.resultant >= 0 && r.resultant <= static_cast<double>(r.n),
             "resultant " + fuzz::num(r.resultant));
  if (r.kappa_valid) FUZZ_CHECK(std::isfinite(r.kappa) && r.kappa > 0, "kappa " + fuzz::num(r.kappa));
  if (r.alpha95_valid) FUZZ_CHECK(r.alpha95 >= 0 && r.alpha95 <= 180, "alpha95 " + fuzz::num(r.alpha95));
  if (r.angular_sd_valid)
    FUZZ_CHECK(std::isfinite(r.angular_sd) && r.angular_sd >= 0, "sd " + fuzz::num(r.angular_sd));
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size) {
  FisherState s;
  try {
    read_fisher_state(data, size, s, "fisher_deserialize");
  } catch (const Error &) {
    return 0;
  }
  std::vector<unsigned char> out(kFisherSerialSize);
  write_fisher_state(s, out.data());
  FUZZ_CHECK(out.size() == size && std::memcmp(out.data(), data, size) == 0, "re-serialized bytes differ");
  check_final(s);
  FisherState c = s;
  try {
    fisher_combine(c, s);
    fisher_validate(c);
  } catch (const Error &) {
    return 0;
  }
  check_final(c);
  return 0;
}
