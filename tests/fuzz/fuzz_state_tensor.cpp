// The orientation-tensor serialized state (tensor_deserialize ->
// read_tensor_state), shared by orientation_tensor, mean_plane, fold_axis.
// Invariants on an accepted state: it serializes back to the same bytes, and
// the fabric is well formed (canonical axes, s1 >= s2 >= s3 >= 0 summing to
// 1, Vollmer indices summing to 1, canonical mean plane and fold axis), for
// the state and for the state combined with itself when that combination is
// valid (see fuzz_state_fisher.cpp on why it may be rejected).
#include "agg_state.hpp"
#include "state_checks.hpp"

using namespace striae;

namespace {

void check_final(const TensorState &s) {
  FabricResult r;
  try {
    r = tensor_result(s);
  } catch (const Error &) {
    return;
  }
  if (r.n == 0) return;
  FUZZ_CHECK(r.axes_valid, "axes");
  FUZZ_CHECK(is_canonical(r.e1) && is_canonical(r.e2) && is_canonical(r.e3), "axes canonical");
  const std::string ev = fuzz::num(r.s1) + " " + fuzz::num(r.s2) + " " + fuzz::num(r.s3);
  FUZZ_CHECK(r.s1 >= r.s2 && r.s2 >= r.s3 && r.s3 >= 0 && std::fabs(r.s1 + r.s2 + r.s3 - 1) < 1e-12, ev);
  FUZZ_CHECK(std::fabs(r.point + r.girdle + r.random - 1) < 1e-12, ev);
  if (r.woodcock_k_valid) FUZZ_CHECK(std::isfinite(r.woodcock_k), ev);
  if (r.woodcock_c_valid) FUZZ_CHECK(std::isfinite(r.woodcock_c), ev);
  if (r.mean_plane_valid) FUZZ_CHECK(is_canonical(r.mean_plane), ev);
  if (r.fold_axis_valid) FUZZ_CHECK(is_canonical(r.fold_axis), ev);
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size) {
  TensorState s;
  try {
    read_tensor_state(data, size, s, "tensor_deserialize");
  } catch (const Error &) {
    return 0;
  }
  std::vector<unsigned char> out(kTensorSerialSize);
  write_tensor_state(s, out.data());
  FUZZ_CHECK(out.size() == size && std::memcmp(out.data(), data, size) == 0, "re-serialized bytes differ");
  check_final(s);
  TensorState c = s;
  try {
    tensor_combine(c, s);
    tensor_validate(c);
  } catch (const Error &) {
    return 0;
  }
  check_final(c);
  return 0;
}
