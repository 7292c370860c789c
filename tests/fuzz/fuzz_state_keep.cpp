// The serialized state of the data-keeping stress inversions
// (stress_keep_deserialize -> read_keep_header, then read_keep_data into an
// array of the header's count, as the glue does). Invariants on an accepted
// state: it serializes back to the same bytes, and for small states the final
// function of its kind (bootstrap inversion, joint focal inversion with or
// without bootstrap, run as the glue runs them) returns a valid stress_tensor
// or none.
#include "agg_state.hpp"
#include "bootstrap.hpp"
#include "state_checks.hpp"

using namespace striae;

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size) {
  KeepParams h;
  std::vector<SlipDatum> d;
  try {
    h = read_keep_header(data, size, "stress_keep_deserialize");
    d.resize(static_cast<size_t>(h.count));
    read_keep_data(data, size, h, d.data(), "stress_keep_deserialize");
  } catch (const Error &) {
    return 0;
  }
  std::vector<unsigned char> out(keep_serial_size(h.count));
  write_keep_state(h, d.data(), out.data());
  FUZZ_CHECK(out.size() == size && std::memcmp(out.data(), data, size) == 0, "re-serialized bytes differ");
  // The final functions (src/pg/stress.cpp), on states small enough to run fast.
  if (h.count == 0 || h.count > 12 || h.resamples > 20) return 0;
  sort_slip_data(d.data(), d.size());
  try {
    BootstrapOptions o;
    o.resamples = h.resamples;
    o.seed = static_cast<uint64_t>(h.seed);
    if (h.kind == kKeepBootstrap) {
      StressTensor t;
      if (stress_bootstrap(d.data(), d.size(), o, t) == StressStatus::Ok) fuzz::check_result_tensor(t, "stress_bootstrap");
      return 0;
    }
    FrictionRange f;
    if (h.friction != 0) {
      f.mu_min = f.mu_max = h.friction;
    } else {
      f.mu_min = 0.2;
      f.mu_max = 1.0;
      f.step = 0.1;
    }
    std::vector<uint8_t> picked(d.size());
    FocalInversion r{};
    const StressStatus st = h.kind == kKeepFocalBootstrap
                                ? focal_bootstrap(d.data(), d.size(), f, o, picked.data(), r)
                                : invert_focal(d.data(), d.size(), f, picked.data(), r);
    if (st == StressStatus::Ok) fuzz::check_result_tensor(r.tensor, "focal inversion");
  } catch (const Error &) {
  }
  return 0;
}
