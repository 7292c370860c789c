// Unit tests of src/core/agg_state: the kind tags every aggregate state
// carries, the serialized forms (round trips and rejections), and the
// regressions of what fuzzing found in the state validation (tests/fuzz/regress
// keeps the inputs; each case below names its finding). Data are invented
// (synthetic round trips).
#include "agg_state.hpp"
#include "bootstrap.hpp"
#include "density.hpp"
#include "grid.hpp"
#include "test_rng.hpp"

#include <gtest/gtest.h>

#include <cstring>
#include <vector>

using namespace striae;
using TestRng = striae_test::Rng;

namespace {

using Bytes = std::vector<unsigned char>;

template <class F>
Error error_of(F &&f) {
  try {
    f();
  } catch (const Error &e) {
    return e;
  }
  ADD_FAILURE() << "no error";
  return Error(ErrorKind::DataError, "none");
}

// Invented fault-slip data, spread over the sphere.
std::vector<FaultSlip> faults(int n) {
  std::vector<FaultSlip> v;
  for (int i = 1; i <= n; ++i) v.push_back(make_fault_slip((i * 29) % 360, 20 + (i * 11) % 60, (i * 47) % 360 - 180));
  return v;
}

template <class T>
void poke(Bytes &b, size_t at, T v) {
  std::memcpy(b.data() + at, &v, sizeof v);
}

}  // namespace

// ---- kind tags ------------------------------------------------------------------------

TEST(StateTag, AcceptsItsKindOnly) {
  struct {
    StateTag tag;
    double payload[4];
  } s{state_tag(StateKind::Fisher), {1, 2, 3, 4}};
  EXPECT_TRUE(state_is(&s, StateKind::Fisher));
  EXPECT_FALSE(state_is(&s, StateKind::Tensor));
  EXPECT_NO_THROW(check_state_kind(&s, "fisher_final", StateKind::Fisher));
  const Error e = error_of([&] { check_state_kind(&s, "tensor_final", StateKind::Tensor); });
  EXPECT_EQ(e.kind, ErrorKind::BadState);
  EXPECT_STREQ(e.what(), "tensor_final: aggregate state of the wrong kind");
  EXPECT_EQ(e.detail,
            "tensor_final takes the state of orientation_tensor, mean_plane and fold_axis; it was handed the state "
            "of fisher_mean.");
}

TEST(StateTag, SharedFunctionsNameEveryKindTheyTake) {
  StateTag t = state_tag(StateKind::KeepBootstrap);
  EXPECT_EQ(check_state_kind(&t, "stress_keep_combine",
                             {StateKind::KeepBootstrap, StateKind::KeepFocal, StateKind::KeepFocalBootstrap}),
            StateKind::KeepBootstrap);
  t = state_tag(StateKind::RightDihedra);
  const Error e = error_of([&] {
    check_state_kind(&t, "focal_stress_inversion_final", {StateKind::KeepFocal, StateKind::KeepFocalBootstrap});
  });
  EXPECT_EQ(e.detail,
            "focal_stress_inversion_final takes the state of focal_stress_inversion(fault_slip [, friction]) or "
            "focal_stress_inversion(fault_slip, friction, resamples, seed); it was handed the state of right_dihedra.");
}

TEST(StateTag, ForeignStates) {
  // A state of another extension or of PostgreSQL: any 8 bytes that are not a tag.
  const uint64_t words[] = {0, 0x00007f3a12345678ull, ~0ull,
                            (uint64_t(99) << 32) | kStateTagMagic,  // our magic, unknown kind
                            uint64_t(kStateTagMagic) << 32};         // magic in the wrong half
  for (uint64_t w : words) {
    const Error e = error_of([&] { check_state_kind(&w, "density_final", StateKind::Density); });
    EXPECT_EQ(e.kind, ErrorKind::BadState);
    EXPECT_EQ(e.detail, "density_final takes the state of density_grid; it was handed a state that striae did not make.")
        << std::hex << w;
  }
}

// ---- fixed-size states ------------------------------------------------------------------

TEST(SerialFixed, RoundTripsAndRejections) {
  TestRng r(11);
  FisherState f;
  TensorState t;
  StressAccum s;
  fisher_init(f);
  tensor_init(t);
  stress_init(s);
  for (int i = 0; i < 700; ++i) {  // more than two blocks of kBlockRows, so sums and blocks are both used
    const Vec3 v = r.unit();
    fisher_add(f, v);
    tensor_add(t, v);
  }
  for (const FaultSlip &x : faults(50)) stress_add_fault(s, x);
  Bytes bf(kFisherSerialSize), bt(kTensorSerialSize), bs(kStressSerialSize);
  write_fisher_state(f, bf.data());
  write_tensor_state(t, bt.data());
  write_stress_state(s, bs.data());
  FisherState f2;
  TensorState t2;
  StressAccum s2;
  read_fisher_state(bf.data(), bf.size(), f2, "fisher_deserialize");
  read_tensor_state(bt.data(), bt.size(), t2, "tensor_deserialize");
  read_stress_state(bs.data(), bs.size(), s2, "stress_inversion_deserialize");
  EXPECT_EQ(std::memcmp(&f, &f2, sizeof f), 0);
  EXPECT_EQ(std::memcmp(&t, &t2, sizeof t), 0);
  EXPECT_EQ(std::memcmp(&s, &s2, sizeof s), 0);

  // another kind's bytes, a short buffer, one byte too many
  Error e = error_of([&] { read_tensor_state(bf.data(), bf.size(), t2, "tensor_deserialize"); });
  EXPECT_EQ(e.kind, ErrorKind::BadState);
  EXPECT_STREQ(e.what(), "tensor_deserialize: not a serialized state of this aggregate");
  EXPECT_EQ(e.detail,
            "tensor_deserialize reads the serialized state of orientation_tensor, mean_plane and fold_axis; these "
            "bytes have another marker or length.");
  e = error_of([&] { read_fisher_state(bf.data(), bf.size() - 1, f2, "fisher_deserialize"); });
  EXPECT_EQ(e.kind, ErrorKind::BadState);
  bs.push_back(0);
  e = error_of([&] { read_stress_state(bs.data(), bs.size(), s2, "stress_inversion_deserialize"); });
  EXPECT_EQ(e.kind, ErrorKind::BadState);
  // the right length with another marker: each kind checks its own magic (agg_state.cpp)
  for (Bytes *b : {&bf, &bt}) {
    Bytes m = *b;
    m[0] ^= 1;
    const bool fisher = b == &bf;
    e = error_of([&] {
      if (fisher) read_fisher_state(m.data(), m.size(), f2, "fisher_deserialize");
      else read_tensor_state(m.data(), m.size(), t2, "tensor_deserialize");
    });
    EXPECT_EQ(e.kind, ErrorKind::BadState) << fisher;
  }
  bs.pop_back();
  bs[3] ^= 0x20;
  e = error_of([&] { read_stress_state(bs.data(), bs.size(), s2, "stress_inversion_deserialize"); });
  EXPECT_EQ(e.kind, ErrorKind::BadState);
}

// Finding (fuzz_state_stress, regress/offdiag-sum-1e308): a state with an
// off-diagonal normal-equation sum of -1e308 passed stress_validate, and two
// such states combined into infinities. Every sum is now within the
// Cauchy-Schwarz bound of its diagonal sums.
TEST(SerialFixed, StressSumsBoundedByCauchySchwarz) {
  StressAccum s;
  stress_init(s);
  for (const FaultSlip &x : faults(3)) stress_add_fault(s, x);
  EXPECT_NO_THROW(stress_validate(s));
  StressAccum bad = s;
  bad.ata[1] = -1.0295100240646454e+308;  // (0,1), the value the fuzzer found
  EXPECT_EQ(error_of([&] { stress_validate(bad); }).kind, ErrorKind::BadState);
  bad = s;
  bad.atu[2] = 3 * std::sqrt(s.ata[9] * s.uu);  // (2,2) is index 9 in kTri order
  EXPECT_EQ(error_of([&] { stress_validate(bad); }).kind, ErrorKind::BadState);
  // the largest off-diagonal value real data give passes: identical data make
  // |a_0.a_1| equal to the bound (Cauchy-Schwarz holds with equality)
  StressAccum same;
  stress_init(same);
  for (int i = 0; i < 1000; ++i) stress_add_fault(same, faults(1)[0]);
  EXPECT_NO_THROW(stress_validate(same));
}

// Finding (fuzz_state_stress): counts were unbounded, so combining two valid
// states could overflow int64. Counts are now at most 2^53 and combine refuses
// to pass it.
TEST(SerialFixed, StressCountLimit) {
  StressAccum s;
  stress_init(s);
  for (const FaultSlip &x : faults(5)) stress_add_fault(s, x);
  StressAccum big = s;
  const double k = static_cast<double>(kMaxStressData) / 5;  // scale 5 data up to 2^53
  big.count = kMaxStressData;
  for (double &v : big.ata) v *= k;
  for (double &v : big.atu) v *= k;
  big.uu *= k;
  EXPECT_NO_THROW(stress_validate(big));
  StressAccum a = big;
  EXPECT_EQ(error_of([&] { stress_combine(a, s); }).kind, ErrorKind::DataError);
  big.count = kMaxStressData + 1;
  EXPECT_EQ(error_of([&] { stress_validate(big); }).kind, ErrorKind::BadState);
}

// ---- density_grid ------------------------------------------------------------------------

TEST(SerialDensity, RoundTripAndRejections) {
  TestRng r(5);
  std::vector<uint32_t> ids;
  std::vector<uint64_t> counts;
  for (int i = 0; i < 500; ++i) {
    ids.push_back(density_bin(r.in_cone(Vec3(0, 0, 1), 30)));
    counts.push_back(1);
  }
  const size_t m = compact_bins(ids.data(), counts.data(), ids.size());
  Bytes b(density_serial_size(m));
  write_density_state(10, ids.data(), counts.data(), m, b.data());
  const DensitySerial h = read_density_header(b.data(), b.size(), "density_deserialize");
  EXPECT_EQ(h.spacing, 10);
  ASSERT_EQ(h.m, m);
  std::vector<uint32_t> ids2(m);
  std::vector<uint64_t> counts2(m);
  read_density_bins(b.data(), b.size(), h, ids2.data(), counts2.data(), "density_deserialize");
  EXPECT_TRUE(std::equal(ids2.begin(), ids2.end(), ids.begin()));
  EXPECT_TRUE(std::equal(counts2.begin(), counts2.end(), counts.begin()));

  // m larger than the number of bins is refused before any length is computed
  Bytes huge = b;
  poke<uint64_t>(huge, 12, uint64_t(1) << 61);
  EXPECT_EQ(error_of([&] { read_density_header(huge.data(), huge.size(), "density_deserialize"); }).kind,
            ErrorKind::BadState);
  // a bad spacing, and an unsorted list
  Bytes sp = b;
  poke<double>(sp, 4, 7.0);
  EXPECT_EQ(error_of([&] { read_density_header(sp.data(), sp.size(), "density_deserialize"); }).kind,
            ErrorKind::BadState);
  if (m >= 2) {
    Bytes uns = b;
    poke<uint32_t>(uns, 20, ids[1]);
    poke<uint32_t>(uns, 24, ids[0]);
    EXPECT_EQ(error_of([&] {
                read_density_bins(uns.data(), uns.size(), h, ids2.data(), counts2.data(), "density_deserialize");
              }).kind,
              ErrorKind::BadState);
  }
}

// Finding (fuzz_state_density, regress/empty-list-null-memcpy): an empty list
// was copied with memcpy from and to null pointers (undefined behaviour even
// for 0 bytes). Run under `make sanitize`, this test would report it.
TEST(SerialDensity, EmptyListWithoutArrays) {
  Bytes b(density_serial_size(0));
  write_density_state(5, nullptr, nullptr, 0, b.data());
  const DensitySerial h = read_density_header(b.data(), b.size(), "density_deserialize");
  EXPECT_EQ(h.m, 0u);
  EXPECT_NO_THROW(read_density_bins(b.data(), b.size(), h, nullptr, nullptr, "density_deserialize"));
}

// Finding (fuzz_state_density, regress/merged-total-above-2p53): two valid
// lists whose totals add beyond 2^53 merged into a list that validate_bins,
// and so the deserialize function, rejects. merge_bins now refuses it.
TEST(SerialDensity, MergeKeepsTheTotalLimit) {
  const uint32_t ids[1] = {7};
  const uint64_t counts[1] = {(uint64_t(1) << 52) + 1};
  EXPECT_NO_THROW(validate_bins(ids, counts, 1));
  uint32_t oi[2];
  uint64_t oc[2];
  EXPECT_EQ(error_of([&] { merge_bins(ids, counts, 1, ids, counts, 1, oi, oc); }).kind, ErrorKind::DataError);
  const uint64_t half[1] = {uint64_t(1) << 52};
  EXPECT_EQ(merge_bins(ids, half, 1, ids, half, 1, oi, oc), 1u);
  EXPECT_EQ(oc[0], uint64_t(1) << 53);
}

// ---- right_dihedra -----------------------------------------------------------------------

TEST(SerialDihedra, RoundTripAndRejections) {
  DihedraHeader h = dihedra_init(10);
  std::vector<int64_t> counts(static_cast<size_t>(h.node_count));
  const std::vector<double> nodes = dihedra_node_table(10);
  for (const FaultSlip &f : faults(40)) {
    const SlipDatum d = slip_datum(f);
    dihedra_add(h, counts.data(), nodes.data(), d.n, d.u);
  }
  Bytes b(dihedra_serial_size(h));
  write_dihedra_state(h, counts.data(), b.data());
  const DihedraHeader h2 = read_dihedra_header(b.data(), b.size(), "right_dihedra_deserialize");
  EXPECT_EQ(std::memcmp(&h, &h2, sizeof h), 0);
  std::vector<int64_t> counts2(counts.size());
  read_dihedra_counts(b.data(), b.size(), h2, counts2.data(), "right_dihedra_deserialize");
  EXPECT_EQ(counts2, counts);
  // a node count that does not match the spacing is refused before allocation
  Bytes nc = b;
  poke<int32_t>(nc, 4 + 16, 1 << 30);
  EXPECT_EQ(error_of([&] { read_dihedra_header(nc.data(), nc.size(), "right_dihedra_deserialize"); }).kind,
            ErrorKind::BadState);
  // a count above twice the data count (counts are in half data)
  Bytes cc = b;
  poke<int64_t>(cc, 4 + 24, 81);
  EXPECT_EQ(error_of([&] { read_dihedra_counts(cc.data(), cc.size(), h2, counts2.data(), "right_dihedra_deserialize"); }).kind,
            ErrorKind::BadState);
}

// Finding (fuzz_state_dihedra, regress/data-count-overflow): data counts were
// unbounded, and combining two valid states with 2^62 data each overflowed
// int64 (undefined behaviour; wrapped negative in the server's -fwrapv build).
TEST(SerialDihedra, DataCountLimit) {
  DihedraHeader h = dihedra_init(45);
  std::vector<int64_t> counts(static_cast<size_t>(h.node_count), 0);
  h.data_count = kMaxDihedraData;
  EXPECT_NO_THROW(dihedra_validate(h, counts.data()));
  DihedraHeader one = dihedra_init(45);
  one.data_count = 1;
  std::vector<int64_t> c2 = counts;
  EXPECT_EQ(error_of([&] { dihedra_combine(h, c2.data(), one, counts.data()); }).kind, ErrorKind::DataError);
  h.data_count = int64_t(1) << 62;
  EXPECT_EQ(error_of([&] { dihedra_validate(h, counts.data()); }).kind, ErrorKind::BadState);
}

// ---- data-keeping inversions ----------------------------------------------------------

TEST(SerialKeep, RoundTripAndParameterChecks) {
  std::vector<SlipDatum> d;
  for (const FaultSlip &f : faults(9)) d.push_back(slip_datum(f));
  const KeepParams kinds[] = {{kKeepBootstrap, 100, -3, 0, 9}, {kKeepFocal, 0, 0, 0, 9},
                              {kKeepFocal, 0, 0, 0.6, 9}, {kKeepFocalBootstrap, 50, 7, 0.4, 9}};
  for (const KeepParams &p : kinds) {
    Bytes b(keep_serial_size(p.count));
    write_keep_state(p, d.data(), b.data());
    const KeepParams q = read_keep_header(b.data(), b.size(), "stress_keep_deserialize");
    EXPECT_TRUE(q.kind == p.kind && q.resamples == p.resamples && q.seed == p.seed && q.friction == p.friction &&
                q.count == p.count);
    std::vector<SlipDatum> d2(d.size());
    read_keep_data(b.data(), b.size(), q, d2.data(), "stress_keep_deserialize");
    EXPECT_EQ(std::memcmp(d2.data(), d.data(), sizeof(SlipDatum) * d.size()), 0);
    EXPECT_EQ(keep_state_kind(p.kind), p.kind == kKeepBootstrap ? StateKind::KeepBootstrap
                                       : p.kind == kKeepFocal   ? StateKind::KeepFocal
                                                                : StateKind::KeepFocalBootstrap);
  }
  // parameters a transition function would never store
  const KeepParams bad[] = {{0, 0, 0, 0, 0},                    // unknown kind
                            {kKeepBootstrap, 0, 1, 0, 0},       // no resamples
                            {kKeepBootstrap, 10, 1, 0.6, 0},    // friction on the plain bootstrap
                            {kKeepFocal, 10, 1, 0, 0},          // resamples without bootstrap
                            {kKeepFocal, 0, 0, 9.0, 0},         // friction out of range
                            {kKeepFocalBootstrap, 10, 1, NAN, 0},
                            {kKeepFocal, 0, 0, 0, -1},
                            {kKeepFocal, 0, 0, 0, static_cast<int64_t>(kMaxBootstrapData) + 1}};  // over the data bound
  for (const KeepParams &p : bad) EXPECT_EQ(error_of([&] { check_keep_params(p); }).kind, ErrorKind::BadState);
  EXPECT_NO_THROW(check_keep_params(KeepParams{kKeepFocal, 0, 0, 0, static_cast<int64_t>(kMaxBootstrapData)}));
  // a datum that is not a unit, orthogonal pair
  d[3].u[0] += 0.01;
  Bytes b(keep_serial_size(9));
  KeepParams p = kinds[1];
  write_keep_state(p, d.data(), b.data());
  const KeepParams q = read_keep_header(b.data(), b.size(), "stress_keep_deserialize");
  std::vector<SlipDatum> d2(9);
  EXPECT_EQ(error_of([&] { read_keep_data(b.data(), b.size(), q, d2.data(), "stress_keep_deserialize"); }).kind,
            ErrorKind::BadState);
}

// Finding (fuzz_state_keep, regress/empty-data-null-memcpy): as for density,
// an empty data array was copied with memcpy and null pointers.
TEST(SerialKeep, EmptyWithoutArray) {
  const KeepParams p{kKeepFocal, 0, 0, 0, 0};
  Bytes b(keep_serial_size(0));
  write_keep_state(p, nullptr, b.data());
  const KeepParams q = read_keep_header(b.data(), b.size(), "stress_keep_deserialize");
  EXPECT_NO_THROW(read_keep_data(b.data(), b.size(), q, nullptr, "stress_keep_deserialize"));
}

// ---- sphere_grid binary input -----------------------------------------------------------

// Finding (fuzz_binary_types, regress/grid-n-above-2p53): binary input
// accepted data counts up to 2^63 - 1, text input at most 2^53, so a stored
// grid could be dumped but not restored. check_grid (binary input) now takes
// exactly the range text input takes.
TEST(GridBinary, DataCountRangeOfText) {
  const int count = grid_node_count(45);
  std::vector<double> v(static_cast<size_t>(count), 10.0);
  EXPECT_NO_THROW(check_grid(GridKind::RightDihedra, 45, int64_t(1) << 53, v.data(), v.size()));
  // A count out of range is 22003 in both inputs (README, "Errors": numbers out of range).
  EXPECT_EQ(error_of([&] { check_grid(GridKind::RightDihedra, 45, (int64_t(1) << 53) + 1, v.data(), v.size()); }).kind,
            ErrorKind::OutOfRange);
  EXPECT_EQ(error_of([&] { check_grid(GridKind::RightDihedra, 45, 2305843009213693956, v.data(), v.size()); }).kind,
            ErrorKind::OutOfRange);
  // and text input reads 2^53 itself
  std::string s = "{\"kind\": \"right_dihedra\", \"spacing\": 45, \"n\": 9007199254740992, \"values\": [";
  for (int k = 0; k < count; ++k) s += k ? ", 10" : "10";
  s += "]}";
  const GridHeader h = parse_grid_header(s.c_str());
  EXPECT_EQ(h.n, int64_t(1) << 53);
  // and the lower limit, one datum (README: n is a whole number of data, at least 1),
  // in text (read as an integer, range checked by check_grid) and binary input alike
  auto with_n = [&](const char *n) {
    std::string t = std::string("{\"kind\": \"right_dihedra\", \"spacing\": 45, \"n\": ") + n + ", \"values\": [";
    for (int k = 0; k < count; ++k) t += k ? ", 10" : "10";
    return t + "]}";
  };
  EXPECT_EQ(parse_grid_header(with_n("1").c_str()).n, 1);
  EXPECT_EQ(error_of([&] { parse_grid_header(with_n("1.5").c_str()); }).kind, ErrorKind::InvalidText);
  EXPECT_NO_THROW(check_grid(GridKind::RightDihedra, 45, 1, v.data(), v.size()));
  EXPECT_EQ(error_of([&] { check_grid(GridKind::RightDihedra, 45, 0, v.data(), v.size()); }).kind, ErrorKind::OutOfRange);
}

// Text input read "n" as a double: 2^53 + 1 rounded to 2^53 and was accepted,
// while binary input rejected it. Now "n" is read as an integer, exactly, and
// both inputs reject it; "1e3" or "3.0" is not an integer.
TEST(GridText, DataCountIsAnInteger) {
  auto text = [](const char *n) {
    std::string s = std::string("{\"kind\": \"density\", \"spacing\": 45, \"n\": ") + n + ", \"values\": [";
    for (int k = 0; k < 11; ++k) s += k ? ", 1" : "1";
    return s + "]}";
  };
  EXPECT_EQ(parse_grid_header(text("9007199254740993").c_str()).n, (int64_t(1) << 53) + 1);
  EXPECT_EQ(parse_grid_header(text("9223372036854775807").c_str()).n, INT64_MAX);
  EXPECT_EQ(error_of([&] { parse_grid_header(text("9223372036854775808").c_str()); }).kind, ErrorKind::OutOfRange);
  EXPECT_EQ(error_of([&] { parse_grid_header(text("1e3").c_str()); }).kind, ErrorKind::InvalidText);
  EXPECT_EQ(error_of([&] { parse_grid_header(text("3.0").c_str()); }).kind, ErrorKind::InvalidText);
}

// A spacing within 1e-9 of 90 / k is that spacing, exactly (stored and printed
// rounded); text and binary input both go through grid_spacing.
TEST(GridText, SpacingSnapped) {
  EXPECT_EQ(grid_spacing(2.50000000001), 2.5);
  EXPECT_EQ(grid_spacing(90.0 / 7.0 + 1e-12), 90.0 / 7.0);
  EXPECT_EQ(grid_spacing(grid_spacing(12.857142857143)), grid_spacing(12.857142857143));
  EXPECT_EQ(error_of([&] { grid_spacing(2.5001); }).kind, ErrorKind::InvalidParameter);
  EXPECT_NO_THROW(check_grid_spacing(2.5));
  EXPECT_EQ(error_of([&] { check_grid_spacing(2.50000000001); }).kind, ErrorKind::InvalidParameter);
  std::string s = "{\"kind\": \"density\", \"spacing\": 45.0000000001, \"n\": 1, \"values\": [";
  for (int k = 0; k < 11; ++k) s += k ? ", 1" : "1";
  s += "]}";
  EXPECT_EQ(parse_grid_header(s.c_str()).spacing, 45.0);
  EXPECT_EQ(dihedra_init(2.50000000001).spacing, 2.5);
}

// ---- the serialized forms moved from the glue (stress_phases, misfit_summary, moment_tensor_sum) ----

TEST(SerialPhases, RoundTripAndRejections) {
  std::vector<SlipDatum> d;
  for (const FaultSlip &f : faults(9)) d.push_back(slip_datum(f));
  const PhaseParams h{2, 20, -5, 9};
  Bytes b(phase_serial_size(h.count));
  write_phase_state(h, d.data(), b.data());
  const PhaseParams r = read_phase_header(b.data(), b.size(), "fn");
  EXPECT_EQ(r.phases, 2);
  EXPECT_EQ(r.starts, 20);
  EXPECT_EQ(r.seed, -5);  // any seed
  std::vector<SlipDatum> back(static_cast<size_t>(r.count));
  read_phase_data(b.data(), b.size(), r, back.data(), "fn");
  EXPECT_EQ(std::memcmp(back.data(), d.data(), sizeof(SlipDatum) * d.size()), 0);
  Bytes bad = b;
  poke<int32_t>(bad, 4, 9);  // phases beyond kMaxPhases
  EXPECT_EQ(error_of([&] { read_phase_header(bad.data(), bad.size(), "fn"); }).kind, ErrorKind::BadState);
  bad = b;
  poke<int64_t>(bad, 20, 10);  // count and length disagree
  EXPECT_EQ(error_of([&] { read_phase_header(bad.data(), bad.size(), "fn"); }).kind, ErrorKind::BadState);
  bad = b;
  poke<double>(bad, kPhaseSerialHeader, 3.0);  // not a unit normal
  EXPECT_EQ(error_of([&] { read_phase_data(bad.data(), bad.size(), r, back.data(), "fn"); }).kind,
            ErrorKind::BadState);
}

TEST(SerialMisfit, RoundTripAndRejections) {
  const std::vector<double> v{0, 12.5, 180};
  const MisfitParams h{30, 4, 3};
  Bytes b(misfit_serial_size(h.count));
  write_misfit_state(h, v.data(), b.data());
  const MisfitParams r = read_misfit_header(b.data(), b.size(), "fn");
  EXPECT_EQ(r.undefined, 4);
  std::vector<double> back(3);
  read_misfit_values(b.data(), b.size(), r, back.data(), "fn");
  EXPECT_EQ(back, v);
  Bytes bad = b;
  poke<double>(bad, 4, 181.0);  // threshold beyond 180
  EXPECT_EQ(error_of([&] { read_misfit_header(bad.data(), bad.size(), "fn"); }).kind, ErrorKind::BadState);
  bad = b;
  poke<int64_t>(bad, 12, kMaxMisfitUndefined + 1);  // undefined count beyond 2^53
  EXPECT_EQ(error_of([&] { read_misfit_header(bad.data(), bad.size(), "fn"); }).kind, ErrorKind::BadState);
  bad = b;
  poke<double>(bad, kMisfitSerialHeader + 8, -1.0);  // a misfit below 0
  EXPECT_EQ(error_of([&] { read_misfit_values(bad.data(), bad.size(), r, back.data(), "fn"); }).kind,
            ErrorKind::BadState);
}

TEST(SerialMoment, RoundTripAndCountLimit) {
  MomentAccum s;
  moment_init(s);
  for (const FaultSlip &f : faults(5)) moment_add(s, f, 1.0, false);
  Bytes b(kMomentSerialSize);
  write_moment_state(s, b.data());
  MomentAccum r;
  read_moment_state(b.data(), b.size(), r, "fn");
  EXPECT_EQ(std::memcmp(&r, &s, sizeof s), 0);
  // two states at the count limit do not overflow when combined
  MomentAccum big = s;
  big.count = kMaxMomentData;
  big.m0 = static_cast<double>(kMaxMomentData);
  EXPECT_NO_THROW(moment_validate(big));
  EXPECT_EQ(error_of([&] { moment_combine(big, s); }).kind, ErrorKind::DataError);
  big.count = kMaxMomentData + 1;
  EXPECT_EQ(error_of([&] { moment_validate(big); }).kind, ErrorKind::BadState);
}
