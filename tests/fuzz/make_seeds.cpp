// Writes the seed corpora of the fuzz harnesses (tests/fuzz/corpus/<target>/):
// literals of every accepted notation (as the README documents them), the wire
// messages of every type, and real serialized aggregate states built with the
// same core functions the aggregates run, from invented data. Run by
// `make fuzz-seeds`; the output is committed (small) so the harnesses start
// from inputs that reach deep into each reader.
#include <cstdio>
#include <string>
#include <sys/stat.h>
#include <vector>

#include "agg_state.hpp"
#include "density.hpp"
#include "grid.hpp"
#include "orientation.hpp"
#include "partial.hpp"

using namespace striae;
using Buf = std::vector<unsigned char>;

namespace {

std::string root;

void put(const std::string &target, int k, const Buf &b) {
  const std::string dir = root + "/" + target;
  mkdir(dir.c_str(), 0755);
  char name[32];
  std::snprintf(name, sizeof name, "/seed-%03d", k);
  FILE *f = std::fopen((dir + name).c_str(), "wb");
  if (!f) {
    std::perror(dir.c_str());
    std::exit(1);
  }
  std::fwrite(b.data(), 1, b.size(), f);
  std::fclose(f);
}

void texts(const std::string &target, const std::vector<std::string> &v) {
  int k = 0;
  for (const std::string &s : v) put(target, ++k, Buf(s.begin(), s.end()));
}

template <class T>
void raw(Buf &b, T v) {
  const unsigned char *p = reinterpret_cast<const unsigned char *>(&v);
  b.insert(b.end(), p, p + sizeof v);
}

template <class T>
void be(Buf &b, T v) {
  unsigned char p[sizeof v];
  std::memcpy(p, &v, sizeof v);
  for (size_t i = 0; i < sizeof v; ++i) b.push_back(p[sizeof v - 1 - i]);
}

// Invented fault-slip data spread over the sphere.
std::vector<FaultSlip> faults(int n) {
  std::vector<FaultSlip> v;
  for (int i = 1; i <= n; ++i) v.push_back(make_fault_slip((i * 29) % 360, 20 + (i * 11) % 60, (i * 47) % 360 - 180));
  return v;
}

std::vector<Line> lines(int n) {
  std::vector<Line> v;
  for (int i = 1; i <= n; ++i) v.push_back(make_line((i * 37) % 360, (i * 13) % 90));
  return v;
}

std::string grid_text(GridKind kind, double spacing, long n, double value) {
  const int count = grid_node_count(spacing);
  std::string s = std::string("{\"kind\": \"") + grid_kind_name(kind) + "\", \"spacing\": " +
                  std::to_string(spacing) + ", \"n\": " + std::to_string(n) + ", \"values\": [";
  for (int k = 0; k < count; ++k) s += (k ? ", " : "") + std::to_string(value + (k % 7) * 0.5);
  return s + "]}";
}

// A serialized state as a partial_state value, as seeds of both partial
// harnesses: its bytes (binary input) and its text.
int partial_seeds = 0;
void partial_seed(StateKind k, PartialInput in, const Buf &state) {
  Buf b(kPartialHeader);
  write_partial_header(k, in, b.data());
  b.insert(b.end(), state.begin(), state.end());
  ++partial_seeds;
  put("fuzz_partial_binary", partial_seeds, b);
  std::string t(partial_text_size(b.data(), b.size()) + 1, '\0');
  write_partial_text(b.data(), b.size(), t.data());
  t.pop_back();
  put("fuzz_partial_text", partial_seeds, Buf(t.begin(), t.end()));
}

}  // namespace

int main(int argc, char **argv) {
  root = argc > 1 ? argv[1] : "tests/fuzz/corpus";
  mkdir(root.c_str(), 0755);

  texts("fuzz_plane_text", {"110/64", "  110 / 64 ", "110,64", "110 64", "110\xc2\xb0/64\xc2\xb0", "290/64S",
                            "110/64 SW", "110/64N", "N70W 64SW", "N70W/64SW", "S70E, 64 SW", "N30E 40SE",
                            "200/64 dd", "200/64DD", "64->200", "64\xe2\x86\x92" "200", "0/0", "359.5/90",
                            "1.1e2/6.4e1", "0/30S", "110/64/3"});
  texts("fuzz_lineation_text", {"120/30", "S60E/30", "N60W/30", "30->120", "300/-30", "0/90", "179.5/0",
                                "120\xc2\xb0, 30\xc2\xb0", "2.5e1/1e1", "30\xe2\x86\x92" "120"});
  texts("fuzz_fault_slip_text", {"110/64/-75", "110/64/-180", "110/64/75 N", "110/64/75 R", "110/64/75 T",
                                 "110/64/75/normal", "110/64/75 SN", "110/64/0 S", "110/64/180 D",
                                 "110/64/75W N", "110/64/75E N", "110/64SW/75W/N", "N70W 64SW/75W R",
                                 "290/64S/90E R", "110/64/0W D", "110/64/30E S N", "200/64 dd/75W reverse",
                                 "0/90/180", "0/0/45"});
  {
    // five float8 (strike, dip, trend, plunge, tolerance), then the sense
    const double geo[][5] = {{110, 64, 200, 63.9, 10}, {0, 90, 0, 0, 5}, {30, 45, 120, 45, 1}, {0, 0, 40, 0, 10}};
    const char *senses[] = {"normal", "n d", "reverse-sinistral", "right-lateral", "thrust, dextral",
                            "left-lateral+normal", "R/S"};
    int k = 0;
    for (const auto &g : geo)
      for (const char *s : senses) {
        Buf b;
        for (double v : g) raw(b, v);
        b.insert(b.end(), s, s + std::strlen(s));
        put("fuzz_sense", ++k, b);
      }
  }
  texts("fuzz_stress_text",
        {"{\"components\": [0.7071067811865476, -0.7071067811865476, 0, 0, 0, 0], \"n\": 5, \"friction\": 0.4, "
         "\"flags\": [\"focal_joint\"]}",
         "{\"components\": [0.7071067811865476, -0.7071067811865476, 0, 0, 0, 0], \"n\": 12, \"misfit\": 4.5, "
         "\"cones\": [10, 12.5, 8], \"phi_interval\": [0.25, 0.5]}",
         "{\"n\": 3, \"components\": [0.408248290463863, 0.408248290463863, -0.816496580927726, 0, 0, 0], "
         "\"flags\": [\"focal_joint\", \"not_converged\"], \"friction\": 0.6}"});
  texts("fuzz_grid_text", {grid_text(GridKind::Density, 45, 3, 0.25), grid_text(GridKind::RightDihedra, 30, 12, 10),
                           grid_text(GridKind::Density, 22.5, 7, 1)});
  {
    int k = 0;
    auto msg = [&](int type, auto fill) {
      Buf b;
      b.push_back(static_cast<unsigned char>(type));
      b.push_back(1);  // wire version
      fill(b);
      put("fuzz_binary_types", ++k, b);
    };
    msg(0, [](Buf &b) { be(b, 110.0); be(b, 64.0); });
    msg(1, [](Buf &b) { be(b, 120.0); be(b, 30.0); });
    msg(2, [](Buf &b) { be(b, 110.0); be(b, 64.0); be(b, -75.0); });
    msg(3, [](Buf &b) {
      const double f[13] = {0.7071067811865476, -0.7071067811865476, 0, 0, 0, 0, 4.5, 10, 12, 8, 0.25, 0.5, 0.6};
      for (double v : f) be(b, v);
      be(b, int64_t(12));
      be(b, uint32_t(kStressHasMisfit | kStressHasCones | kStressHasPhiInterval | kStressHasFriction |
                     kStressFocalJoint));
    });
    msg(4, [](Buf &b) {
      be(b, int32_t(2));
      be(b, 45.0);
      be(b, int64_t(4));
      const int32_t count = grid_node_count(45);
      be(b, count);
      for (int i = 0; i < count; ++i) be(b, 25.0 * (i % 5));
    });
  }

  // Aggregate states, serialized as the serialize functions write them.
  {
    int k = 0;
    for (int n : {0, 1, 3, 40, 300}) {
      FisherState f;
      TensorState t;
      fisher_init(f);
      tensor_init(t);
      for (const Line &l : lines(n)) {
        fisher_add(f, line_vector(l));
        tensor_add(t, line_vector(l));
      }
      Buf bf(kFisherSerialSize), bt(kTensorSerialSize);
      write_fisher_state(f, bf.data());
      write_tensor_state(t, bt.data());
      put("fuzz_state_fisher", ++k, bf);
      put("fuzz_state_tensor", k, bt);
      if (n <= 40) {
        partial_seed(StateKind::Fisher, n % 2 ? PartialInput::Plane : PartialInput::Lineation, bf);
        partial_seed(StateKind::Tensor, n % 2 ? PartialInput::Lineation : PartialInput::Plane, bt);
      }
    }
  }
  {
    int k = 0;
    for (int n : {0, 3, 4, 25, 200}) {
      StressAccum s;
      stress_init(s);
      for (const FaultSlip &f : faults(n)) stress_add_fault(s, f);
      Buf b(kStressSerialSize);
      write_stress_state(s, b.data());
      put("fuzz_state_stress", ++k, b);
      partial_seed(StateKind::StressLinear, PartialInput::FaultSlip, b);
    }
  }
  {
    int k = 0;
    for (int n : {0, 1, 5, 60}) {
      for (double spacing : {10.0, 45.0}) {
        std::vector<uint32_t> ids;
        std::vector<uint64_t> counts;
        for (const Line &l : lines(n)) {
          ids.push_back(density_bin(line_vector(l)));
          counts.push_back(1);
        }
        const size_t m = compact_bins(ids.data(), counts.data(), ids.size());
        Buf b(density_serial_size(m));
        write_density_state(spacing, ids.data(), counts.data(), m, b.data());
        put("fuzz_state_density", ++k, b);
        if (n <= 5) partial_seed(StateKind::Density, spacing == 10 ? PartialInput::Plane : PartialInput::Lineation, b);
      }
    }
  }
  {
    int k = 0;
    for (int n : {0, 1, 7, 50}) {
      for (double spacing : {30.0, 45.0}) {
        DihedraHeader h = dihedra_init(spacing);
        std::vector<int64_t> counts(static_cast<size_t>(h.node_count));
        const std::vector<double> nodes = dihedra_node_table(spacing);
        for (const FaultSlip &f : faults(n)) {
          const SlipDatum d = slip_datum(f);
          dihedra_add(h, counts.data(), nodes.data(), d.n, d.u);
        }
        Buf b(dihedra_serial_size(h));
        write_dihedra_state(h, counts.data(), b.data());
        put("fuzz_state_dihedra", ++k, b);
        if (spacing == 45) partial_seed(StateKind::RightDihedra, PartialInput::FaultSlip, b);
      }
    }
  }
  {
    int k = 0;
    const KeepParams kinds[] = {{kKeepBootstrap, 5, 1, 0, 0}, {kKeepFocal, 0, 0, 0, 0}, {kKeepFocal, 0, 0, 0.6, 0},
                                {kKeepFocalBootstrap, 4, 7, 0, 0}, {kKeepFocalBootstrap, 3, 2, 0.4, 0}};
    for (KeepParams p : kinds)
      for (int n : {0, 2, 6, 12}) {
        std::vector<SlipDatum> d;
        for (const FaultSlip &f : faults(n)) d.push_back(slip_datum(f));
        p.count = n;
        Buf b(keep_serial_size(n));
        write_keep_state(p, d.data(), b.data());
        put("fuzz_state_keep", ++k, b);
        if (n == 6) partial_seed(keep_state_kind(p.kind), PartialInput::FaultSlip, b);
      }
  }
  // the states serialized in agg_state since the two-phase forms (stress_phases,
  // misfit_summary, moment_tensor_sum), as partials
  for (int n : {0, 9}) {
    std::vector<SlipDatum> d;
    for (const FaultSlip &f : faults(n)) d.push_back(slip_datum(f));
    const PhaseParams h{2, 20, 7, n};
    Buf b(phase_serial_size(n));
    write_phase_state(h, d.data(), b.data());
    partial_seed(StateKind::Phases, PartialInput::FaultSlip, b);
  }
  {
    const std::vector<double> v{0, 3.5, 42, 90, 179.25};
    const MisfitParams h{30, 2, static_cast<int64_t>(v.size())};
    Buf b(misfit_serial_size(h.count));
    write_misfit_state(h, v.data(), b.data());
    partial_seed(StateKind::MisfitSummary, PartialInput::FaultSlip, b);
  }
  for (int weighted : {-1, 0, 1}) {
    MomentAccum s;
    moment_init(s);
    if (weighted >= 0)
      for (const FaultSlip &f : faults(7)) moment_add(s, f, weighted ? moment_from_magnitude(4.5) : 1.0, weighted == 1);
    Buf b(kMomentSerialSize);
    write_moment_state(s, b.data());
    partial_seed(StateKind::MomentSum, PartialInput::FaultSlip, b);
  }
  return 0;
}
