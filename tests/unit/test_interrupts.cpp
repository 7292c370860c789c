// Cancellation (core.hpp, DESIGN.md "Interrupts"): the long computations of
// src/core poll the interrupt hook in their loops over the data and the
// parameters, and a hook that says stop ends them with striae::Cancelled,
// which no catch for std::exception or striae::Error swallows. The polls are
// counted (a deterministic property, not a timing): a loop over R resamples,
// S starts or F friction values polls at least R, S or F times, and loops over
// the data at least once per 65,536 data. The server-side check of the same
// (statement_timeout, pg_cancel_backend) is tests/external/check_interrupts.py.
#include <gtest/gtest.h>

#include <vector>

#include "bootstrap.hpp"
#include "density.hpp"
#include "grid.hpp"
#include "phases.hpp"
#include "stress.hpp"
#include "test_rng.hpp"

using namespace striae;

namespace {

long g_polls = 0;
long g_stop_at = -1;  // stop at this poll (1-based); -1: never

bool counting_hook() {
  ++g_polls;
  return g_stop_at > 0 && g_polls >= g_stop_at;
}

// Installs the counting hook for one test and removes it afterwards.
struct Hooked {
  explicit Hooked(long stop_at = -1) {
    g_polls = 0;
    g_stop_at = stop_at;
    interrupt_hook = counting_hook;
  }
  ~Hooked() { interrupt_hook = nullptr; }
};

// Random fault-slip data (n, u orthogonal unit vectors), fixed seed.
std::vector<SlipDatum> slip_data(size_t n, uint64_t seed) {
  striae_test::Rng r(seed);
  std::vector<SlipDatum> d(n);
  for (auto &x : d) {
    Vec3 nv = r.unit();
    if (nv.z() > 0) nv = -nv;
    const Vec3 uv = nv.unitOrthogonal();
    for (int k = 0; k < 3; ++k) {
      x.n[k] = nv[k];
      x.u[k] = uv[k];
    }
  }
  return d;
}

// True if f() ends with Cancelled (and nothing else).
template <class F>
bool cancelled(F &&f) {
  try {
    f();
  } catch (const Cancelled &) {
    return true;
  }
  return false;
}

}  // namespace

TEST(Interrupts, BootstrapPollsWithinBoundedWork) {
  // The first batch's draws poll per resample; later batches are drawn inside
  // the sums' kernel (kernels.hpp), which polls per block of 128 data, i.e.
  // after at most 128 x 16 draws and as many weighted sums (a few microseconds).
  const auto d = slip_data(200, 1);
  BootstrapOptions o;
  o.resamples = 300;
  StressTensor t;
  {
    Hooked h;
    ASSERT_EQ(stress_bootstrap(d.data(), d.size(), o, t), StressStatus::Ok);
    // 16 polls for the first batch's draws, 2 blocks per batch in 19 batches.
    EXPECT_GE(g_polls, 16 + 2 * 19);
  }
  Hooked h(40);
  EXPECT_TRUE(cancelled([&] { stress_bootstrap(d.data(), d.size(), o, t); }));
  EXPECT_EQ(g_polls, 40);
}

TEST(Interrupts, BootstrapPollsWithinLargeResamples) {
  // One resample of 200,000 data: polls inside the draws and the sums.
  const auto d = slip_data(200000, 2);
  BootstrapOptions o;
  o.resamples = 1;
  StressTensor t;
  Hooked h;
  ASSERT_EQ(stress_bootstrap(d.data(), d.size(), o, t), StressStatus::Ok);
  // checks, table, draws and sums: 4 passes over 200,000 data at one poll per 65,536
  EXPECT_GE(g_polls, 4 * 3);
}

TEST(Interrupts, FocalBootstrapAndFrictionSearch) {
  const auto d = slip_data(300, 3);
  std::vector<uint8_t> picked(d.size());
  FrictionRange fr;
  fr.mu_min = 0.2;
  fr.mu_max = 1.0;
  fr.step = 0.1;
  FocalInversion out;
  {
    Hooked h;
    ASSERT_EQ(invert_focal(d.data(), d.size(), fr, picked.data(), out), StressStatus::Ok);
    EXPECT_GE(g_polls, 9);  // each friction value, and each iteration at it
  }
  BootstrapOptions o;
  o.resamples = 50;
  {
    Hooked h;
    ASSERT_EQ(focal_bootstrap(d.data(), d.size(), fr, o, picked.data(), out), StressStatus::Ok);
    EXPECT_GE(g_polls, 9 + 50);
  }
  Hooked h(5);
  EXPECT_TRUE(cancelled([&] { invert_focal(d.data(), d.size(), fr, picked.data(), out); }));
}

TEST(Interrupts, PhaseStarts) {
  const auto d = slip_data(100, 4);
  PhaseOptions o;
  o.phases = 2;
  o.starts = 40;
  std::vector<StressTensor> out;
  {
    Hooked h;
    separate_phases(d.data(), d.size(), o, out);
    EXPECT_GE(g_polls, o.starts);
  }
  Hooked h(20);
  EXPECT_TRUE(cancelled([&] { separate_phases(d.data(), d.size(), o, out); }));
}

TEST(Interrupts, DensityPollsEachBinAndRing) {
  striae_test::Rng r(5);
  std::vector<uint32_t> ids(500);
  std::vector<uint64_t> counts(500, 1);
  for (auto &i : ids) i = density_bin(r.unit());
  const size_t m = compact_bins(ids.data(), counts.data(), ids.size());
  std::vector<double> out(static_cast<size_t>(grid_node_count(1.0)));
  {
    Hooked h;
    density_values(ids.data(), counts.data(), m, 1.0, out.data());
    EXPECT_GE(g_polls, static_cast<long>(m) + 91);  // each bin, each ring of the output grid
  }
  Hooked h(100);
  EXPECT_TRUE(cancelled([&] { density_values(ids.data(), counts.data(), m, 1.0, out.data()); }));
  // A cancelled computation leaves nothing behind: the next one is whole.
  interrupt_hook = nullptr;
  std::vector<double> again(out.size());
  density_values(ids.data(), counts.data(), m, 1.0, again.data());
  density_values(ids.data(), counts.data(), m, 1.0, out.data());
  EXPECT_EQ(again, out);
}

TEST(Interrupts, GridNodes) {
  Hooked h;
  const auto v = grid_node_vectors(0.5);
  EXPECT_EQ(v.size(), 82508u);  // grid_node_count(0.5): the finest layout
  EXPECT_GE(g_polls, 181);      // one a ring: 180 rings and the vertical node
}

TEST(Interrupts, SortAndMisfits) {
  auto d = slip_data(300000, 6);
  {
    Hooked h;
    sort_slip_data(d.data(), d.size());
    EXPECT_GE(g_polls, 10);  // n log n comparisons, one poll per 65,536
  }
  std::vector<double> v(1000000);
  striae_test::Rng r(7);
  for (double &x : v) x = 180 * r.uniform();
  MisfitSummary s;
  Hooked h;
  summarise_misfits(v.data(), v.size(), 0, 30, s);
  EXPECT_GE(g_polls, 15);  // the sum and the selection of the median
}

TEST(Interrupts, CancelledIsNoStdException) {
  Hooked h(1);
  // striae::Error derives from std::exception: the catch below is the one
  // src/core uses around its own calls, and it must not see a cancellation.
  bool as_std = false, as_cancel = false;
  try {
    try {
      poll_interrupts();
    } catch (const std::exception &) {
      as_std = true;
    }
  } catch (const Cancelled &) {
    as_cancel = true;
  }
  EXPECT_FALSE(as_std);
  EXPECT_TRUE(as_cancel);
}
