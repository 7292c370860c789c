// stress_inversion(fault_slip)'s serialized state (stress_inversion_deserialize
// -> read_stress_state). Invariants on an accepted state: it serializes back
// to the same bytes; a tensor the final function returns is a valid
// stress_tensor; and the state combined with itself is either rejected
// cleanly or valid.
#include "agg_state.hpp"
#include "state_checks.hpp"

using namespace striae;

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size) {
  StressAccum s;
  try {
    read_stress_state(data, size, s, "stress_inversion_deserialize");
  } catch (const Error &) {
    return 0;
  }
  std::vector<unsigned char> out(kStressSerialSize);
  write_stress_state(s, out.data());
  FUZZ_CHECK(out.size() == size && std::memcmp(out.data(), data, size) == 0, "re-serialized bytes differ");
  try {
    StressTensor t;
    if (stress_finalise(s, t) == StressStatus::Ok) {
      fuzz::check_result_tensor(t, "stress_finalise");
      FUZZ_CHECK(t.data_count == s.count, "data count");
    }
  } catch (const Error &) {
  }
  StressAccum c = s;
  try {
    stress_combine(c, s);
  } catch (const Error &) {
    return 0;
  }
  try {
    stress_validate(c);
  } catch (const Error &e) {
    fuzz::fail("a valid state combined with itself is invalid", std::string(e.what()) + " | " + e.detail);
  }
  return 0;
}
