// Kind tags and serialized forms of the aggregate states (agg_state.hpp).
#include "agg_state.hpp"

#include "bootstrap.hpp"
#include "density.hpp"
#include "phases.hpp"

#include <cmath>
#include <cstring>
#include <string>

namespace striae {

// ---- kind tags ----------------------------------------------------------------

const char *state_kind_aggregates(StateKind k) {
  switch (k) {
    case StateKind::Fisher: return "fisher_mean";
    case StateKind::Tensor: return "orientation_tensor, mean_plane and fold_axis";
    case StateKind::Density: return "density_grid";
    case StateKind::StressLinear: return "stress_inversion(fault_slip)";
    case StateKind::RightDihedra: return "right_dihedra";
    case StateKind::KeepBootstrap: return "stress_inversion(fault_slip, resamples, seed)";
    case StateKind::KeepFocal: return "focal_stress_inversion(fault_slip [, friction])";
    case StateKind::KeepFocalBootstrap: return "focal_stress_inversion(fault_slip, friction, resamples, seed)";
    case StateKind::Phases: return "stress_phases";
    case StateKind::MisfitSummary: return "misfit_summary";
    case StateKind::MomentSum: return "moment_tensor_sum";
    case StateKind::FigureLayer: return "the figure layer aggregates (net_poles, net_faults, ...)";
    case StateKind::FigureStack: return "net_stack";
    case StateKind::PartialMerge: return "the two-phase merges over partial_state (fisher_mean(partial_state), ..., merge_partial)";
  }
  return "no striae aggregate";
}

namespace {

bool known_kind(uint32_t k) { return k >= 1 && k <= 14; }

}  // namespace

StateKind check_state_kind(const void *state, const char *fn, std::initializer_list<StateKind> accepted) {
  StateTag t;
  std::memcpy(&t, state, sizeof t);
  for (StateKind k : accepted)
    if (t.magic == kStateTagMagic && t.kind == static_cast<uint32_t>(k)) return k;
  std::string takes;
  size_t i = 0;
  for (StateKind k : accepted) {
    if (i > 0) takes += i + 1 == accepted.size() ? " or " : ", ";
    takes += state_kind_aggregates(k);
    ++i;
  }
  const bool ours = t.magic == kStateTagMagic && known_kind(t.kind);
  const std::string handed =
      ours ? std::string("the state of ") + state_kind_aggregates(static_cast<StateKind>(t.kind))
           : std::string("a state that striae did not make");
  throw Error(ErrorKind::BadState, std::string(fn) + ": aggregate state of the wrong kind",
              std::string(fn) + " takes the state of " + takes + "; it was handed " + handed + ".",
              "The support functions of an aggregate must all come from one striae aggregate.");
}

// ---- helpers ------------------------------------------------------------------------

namespace {

[[noreturn]] void not_serial(const char *fn, StateKind k) {
  throw Error(ErrorKind::BadState, std::string(fn) + ": not a serialized state of this aggregate",
              std::string(fn) + " reads the serialized state of " + state_kind_aggregates(k) +
                  "; these bytes have another marker or length.");
}

[[noreturn]] void not_serial_keep(const char *fn) {
  throw Error(ErrorKind::BadState, std::string(fn) + ": not a serialized state of this aggregate",
              std::string(fn) + " reads the serialized state of stress_inversion(fault_slip, resamples, seed) "
                                "and focal_stress_inversion; these bytes have another marker or length.");
}

template <class T>
T load(const unsigned char *p) {
  T v;
  std::memcpy(&v, p, sizeof v);
  return v;
}

template <class T>
void store(unsigned char *p, const T &v) {
  std::memcpy(p, &v, sizeof v);
}

// Serialized magics (first 4 bytes): each kind its own.
constexpr uint32_t kFisherMagic = 0x53464931;    // "SFI1"
constexpr uint32_t kTensorMagic = 0x53544e31;    // "STN1"
constexpr uint32_t kStressMagic = 0x53535431;    // "SST1"
constexpr uint32_t kDensityMagic = 0x53444e31;   // "SDN1"
constexpr uint32_t kDihedraMagic = 0x53524432;   // "SRD2": counts in half data since 0.2.0
constexpr uint32_t kKeepMagic = 0x53534b31;      // "SSK1"
constexpr uint32_t kPhaseMagic = 0x53504831;     // "SPH1"
constexpr uint32_t kMisfitMagic = 0x534d5331;    // "SMS1"
constexpr uint32_t kMomentMagic = 0x534d5431;    // "SMT1"

template <class S>
void write_fixed(uint32_t magic, const S &s, unsigned char *out) {
  store(out, magic);
  std::memcpy(out + 4, &s, sizeof(S));
}

template <class S>
void read_fixed(uint32_t magic, StateKind k, const unsigned char *p, size_t len, S &out, const char *fn) {
  if (len != 4 + sizeof(S) || load<uint32_t>(p) != magic) not_serial(fn, k);
  std::memcpy(&out, p + 4, sizeof(S));
}

}  // namespace

// ---- fixed-size states -------------------------------------------------------------

void write_fisher_state(const FisherState &s, unsigned char *out) {
  fisher_validate(s);
  write_fixed(kFisherMagic, s, out);
}
void write_tensor_state(const TensorState &s, unsigned char *out) {
  tensor_validate(s);
  write_fixed(kTensorMagic, s, out);
}
void write_stress_state(const StressAccum &s, unsigned char *out) {
  stress_validate(s);
  write_fixed(kStressMagic, s, out);
}
void write_moment_state(const MomentAccum &s, unsigned char *out) {
  moment_validate(s);
  write_fixed(kMomentMagic, s, out);
}

void read_fisher_state(const unsigned char *p, size_t len, FisherState &out, const char *fn) {
  read_fixed(kFisherMagic, StateKind::Fisher, p, len, out, fn);
  fisher_validate(out);
}
void read_tensor_state(const unsigned char *p, size_t len, TensorState &out, const char *fn) {
  read_fixed(kTensorMagic, StateKind::Tensor, p, len, out, fn);
  tensor_validate(out);
}
void read_stress_state(const unsigned char *p, size_t len, StressAccum &out, const char *fn) {
  read_fixed(kStressMagic, StateKind::StressLinear, p, len, out, fn);
  stress_validate(out);
}
void read_moment_state(const unsigned char *p, size_t len, MomentAccum &out, const char *fn) {
  read_fixed(kMomentMagic, StateKind::MomentSum, p, len, out, fn);
  moment_validate(out);
}

// ---- density_grid ---------------------------------------------------------------------

namespace {
constexpr size_t kDensityHeader = 4 + 8 + 8;
constexpr size_t kDensityEntry = sizeof(uint32_t) + sizeof(uint64_t);
}  // namespace

size_t density_serial_size(size_t m) { return kDensityHeader + m * kDensityEntry; }

void write_density_state(double spacing, const uint32_t *ids, const uint64_t *counts, size_t m,
                         unsigned char *out) {
  store(out, kDensityMagic);
  store(out + 4, spacing);
  store(out + 12, static_cast<uint64_t>(m));
  if (m > 0) {
    std::memcpy(out + kDensityHeader, ids, sizeof(uint32_t) * m);
    std::memcpy(out + kDensityHeader + sizeof(uint32_t) * m, counts, sizeof(uint64_t) * m);
  }
}

DensitySerial read_density_header(const unsigned char *p, size_t len, const char *fn) {
  if (len < kDensityHeader || load<uint32_t>(p) != kDensityMagic) not_serial(fn, StateKind::Density);
  DensitySerial h{load<double>(p + 4), load<uint64_t>(p + 12)};
  // m is bounded before it is multiplied: a compacted list has at most one
  // entry per bin.
  if (h.m > density_bin_count() || len != density_serial_size(static_cast<size_t>(h.m)))
    not_serial(fn, StateKind::Density);
  try {
    check_grid_spacing(h.spacing);
  } catch (const Error &e) {
    throw Error(ErrorKind::BadState, std::string(fn) + ": invalid density_grid state: " + e.what());
  }
  return h;
}

void read_density_bins(const unsigned char *p, size_t len, const DensitySerial &h, uint32_t *ids,
                       uint64_t *counts, const char *fn) {
  const size_t m = static_cast<size_t>(h.m);
  if (len != density_serial_size(m)) not_serial(fn, StateKind::Density);
  if (m > 0) {  // memcpy with a null pointer is undefined even for 0 bytes
    std::memcpy(ids, p + kDensityHeader, sizeof(uint32_t) * m);
    std::memcpy(counts, p + kDensityHeader + sizeof(uint32_t) * m, sizeof(uint64_t) * m);
  }
  validate_bins(ids, counts, m);
}

// ---- right_dihedra -------------------------------------------------------------------

size_t dihedra_serial_size(const DihedraHeader &h) {
  return 4 + sizeof(DihedraHeader) + sizeof(int64_t) * static_cast<size_t>(h.node_count);
}

void write_dihedra_state(const DihedraHeader &h, const int64_t *counts, unsigned char *out) {
  dihedra_validate(h, counts);
  store(out, kDihedraMagic);
  std::memcpy(out + 4, &h, sizeof h);
  std::memcpy(out + 4 + sizeof h, counts, sizeof(int64_t) * static_cast<size_t>(h.node_count));
}

DihedraHeader read_dihedra_header(const unsigned char *p, size_t len, const char *fn) {
  if (len < 4 + sizeof(DihedraHeader) || load<uint32_t>(p) != kDihedraMagic)
    not_serial(fn, StateKind::RightDihedra);
  DihedraHeader h;
  std::memcpy(&h, p + 4, sizeof h);
  // The node count must be the spacing's before any length is computed from it.
  bool spacing_ok = true;
  try {
    check_grid_spacing(h.spacing);
  } catch (const Error &) {
    spacing_ok = false;
  }
  if (!spacing_ok || h.node_count != grid_node_count(h.spacing) || len != dihedra_serial_size(h))
    not_serial(fn, StateKind::RightDihedra);
  if (h.reserved != 0 || h.data_count < 0)
    throw Error(ErrorKind::BadState, std::string(fn) + ": invalid right-dihedra state header");
  return h;
}

void read_dihedra_counts(const unsigned char *p, size_t len, const DihedraHeader &h, int64_t *counts,
                         const char *fn) {
  if (len != dihedra_serial_size(h)) not_serial(fn, StateKind::RightDihedra);
  std::memcpy(counts, p + 4 + sizeof(DihedraHeader), sizeof(int64_t) * static_cast<size_t>(h.node_count));
  dihedra_validate(h, counts);
}

// ---- data-keeping stress inversions --------------------------------------------------------

void check_keep_params(const KeepParams &h) {
  auto bad = [](const std::string &what) {
    throw Error(ErrorKind::BadState, "invalid stress inversion state: " + what);
  };
  if (h.kind != kKeepBootstrap && h.kind != kKeepFocal && h.kind != kKeepFocalBootstrap) bad("unknown kind");
  if (h.count < 0 || h.count > static_cast<int64_t>(kMaxBootstrapData)) bad("bad count");
  if (h.kind == kKeepBootstrap || h.kind == kKeepFocalBootstrap) {
    BootstrapOptions o;
    o.resamples = h.resamples;
    o.seed = static_cast<uint64_t>(h.seed);
    try {
      check_bootstrap_options(o);
    } catch (const Error &e) {
      bad(e.what());
    }
  } else if (h.resamples != 0 || h.seed != 0) {
    bad("resamples and seed of an inversion without bootstrap");
  }
  if (h.kind == kKeepBootstrap) {
    if (h.friction != 0) bad("friction of an inversion without friction");
  } else if (h.friction != 0) {  // 0: the default friction search
    try {
      check_friction(h.friction);
    } catch (const Error &e) {
      bad(e.what());
    }
  }
}

StateKind keep_state_kind(int32_t kind) {
  switch (kind) {
    case kKeepBootstrap: return StateKind::KeepBootstrap;
    case kKeepFocal: return StateKind::KeepFocal;
    case kKeepFocalBootstrap: return StateKind::KeepFocalBootstrap;
  }
  throw Error(ErrorKind::BadState, "invalid stress inversion state: unknown kind");
}

size_t keep_serial_size(int64_t count) {
  return kKeepSerialHeader + sizeof(SlipDatum) * static_cast<size_t>(count);
}

void write_keep_state(const KeepParams &h, const SlipDatum *data, unsigned char *out) {
  check_keep_params(h);
  store(out, kKeepMagic);
  store(out + 4, h.kind);
  store(out + 8, h.resamples);
  store(out + 12, h.seed);
  store(out + 20, h.friction);
  store(out + 28, h.count);
  if (h.count > 0) std::memcpy(out + kKeepSerialHeader, data, sizeof(SlipDatum) * static_cast<size_t>(h.count));
}

KeepParams read_keep_header(const unsigned char *p, size_t len, const char *fn) {
  if (len < kKeepSerialHeader || load<uint32_t>(p) != kKeepMagic) not_serial_keep(fn);
  KeepParams h;
  h.kind = load<int32_t>(p + 4);
  h.resamples = load<int32_t>(p + 8);
  h.seed = load<int64_t>(p + 12);
  h.friction = load<double>(p + 20);
  h.count = load<int64_t>(p + 28);
  // count is bounded before the length is computed from it.
  if (h.count < 0 || h.count > static_cast<int64_t>(kMaxBootstrapData) || len != keep_serial_size(h.count))
    not_serial_keep(fn);
  check_keep_params(h);
  return h;
}

void read_keep_data(const unsigned char *p, size_t len, const KeepParams &h, SlipDatum *out,
                    const char *fn) {
  if (len != keep_serial_size(h.count)) not_serial_keep(fn);
  if (h.count > 0) std::memcpy(out, p + kKeepSerialHeader, sizeof(SlipDatum) * static_cast<size_t>(h.count));
  check_keep_data(out, h.count);
}

void check_keep_data(const SlipDatum *data, int64_t count) {
  for (int64_t i = 0; i < count; ++i) {
    if ((i & 0xffff) == 0xffff) poll_interrupts();
    try {
      check_slip_datum(data[i].n, data[i].u);
    } catch (const Error &e) {
      throw Error(ErrorKind::BadState, std::string("invalid stress inversion state: ") + e.what());
    }
  }
}

// ---- stress_phases ----------------------------------------------------------------------

void check_phase_params(const PhaseParams &h) {
  PhaseOptions o;
  o.phases = h.phases;
  o.starts = h.starts;
  try {
    check_phase_options(o);
  } catch (const Error &e) {
    throw Error(ErrorKind::BadState, std::string("invalid stress_phases state: ") + e.what());
  }
  if (h.count < 0 || h.count > static_cast<int64_t>(kMaxBootstrapData))
    throw Error(ErrorKind::BadState, "invalid stress_phases state: bad count");
}

size_t phase_serial_size(int64_t count) {
  return kPhaseSerialHeader + sizeof(SlipDatum) * static_cast<size_t>(count);
}

void write_phase_state(const PhaseParams &h, const SlipDatum *data, unsigned char *out) {
  check_phase_params(h);
  store(out, kPhaseMagic);
  store(out + 4, h.phases);
  store(out + 8, h.starts);
  store(out + 12, h.seed);
  store(out + 20, h.count);
  if (h.count > 0) std::memcpy(out + kPhaseSerialHeader, data, sizeof(SlipDatum) * static_cast<size_t>(h.count));
}

PhaseParams read_phase_header(const unsigned char *p, size_t len, const char *fn) {
  if (len < kPhaseSerialHeader || load<uint32_t>(p) != kPhaseMagic) not_serial(fn, StateKind::Phases);
  PhaseParams h;
  h.phases = load<int32_t>(p + 4);
  h.starts = load<int32_t>(p + 8);
  h.seed = load<int64_t>(p + 12);
  h.count = load<int64_t>(p + 20);
  // count is bounded before the length is computed from it.
  if (h.count < 0 || h.count > static_cast<int64_t>(kMaxBootstrapData) || len != phase_serial_size(h.count))
    not_serial(fn, StateKind::Phases);
  check_phase_params(h);
  return h;
}

void read_phase_data(const unsigned char *p, size_t len, const PhaseParams &h, SlipDatum *out, const char *fn) {
  if (len != phase_serial_size(h.count)) not_serial(fn, StateKind::Phases);
  if (h.count > 0) std::memcpy(out, p + kPhaseSerialHeader, sizeof(SlipDatum) * static_cast<size_t>(h.count));
  check_phase_data(out, h.count);
}

void check_phase_data(const SlipDatum *data, int64_t count) {
  for (int64_t i = 0; i < count; ++i) {
    if ((i & 0xffff) == 0xffff) poll_interrupts();
    try {
      check_slip_datum(data[i].n, data[i].u);
    } catch (const Error &e) {
      throw Error(ErrorKind::BadState, std::string("invalid stress_phases state: ") + e.what());
    }
  }
}

// ---- misfit_summary ----------------------------------------------------------------------

void check_misfit_params(const MisfitParams &h) {
  try {
    check_misfit_threshold(h.threshold);
  } catch (const Error &e) {
    throw Error(ErrorKind::BadState, std::string("invalid misfit_summary state: ") + e.what());
  }
  if (h.count < 0 || h.count > kMaxMisfits || h.undefined < 0 || h.undefined > kMaxMisfitUndefined)
    throw Error(ErrorKind::BadState, "invalid misfit_summary state: bad count");
}

void check_misfit_values(const double *v, int64_t count) {
  for (int64_t i = 0; i < count; ++i) {
    if ((i & 0xfffff) == 0xfffff) poll_interrupts();
    if (!(v[i] >= 0 && v[i] <= 180))
      throw Error(ErrorKind::BadState, "invalid misfit_summary state: misfit outside 0..180");
  }
}

size_t misfit_serial_size(int64_t count) {
  return kMisfitSerialHeader + sizeof(double) * static_cast<size_t>(count);
}

void write_misfit_state(const MisfitParams &h, const double *values, unsigned char *out) {
  check_misfit_params(h);
  store(out, kMisfitMagic);
  store(out + 4, h.threshold);
  store(out + 12, h.undefined);
  store(out + 20, h.count);
  if (h.count > 0) std::memcpy(out + kMisfitSerialHeader, values, sizeof(double) * static_cast<size_t>(h.count));
}

MisfitParams read_misfit_header(const unsigned char *p, size_t len, const char *fn) {
  if (len < kMisfitSerialHeader || load<uint32_t>(p) != kMisfitMagic) not_serial(fn, StateKind::MisfitSummary);
  MisfitParams h;
  h.threshold = load<double>(p + 4);
  h.undefined = load<int64_t>(p + 12);
  h.count = load<int64_t>(p + 20);
  if (h.count < 0 || h.count > kMaxMisfits || len != misfit_serial_size(h.count))
    not_serial(fn, StateKind::MisfitSummary);
  check_misfit_params(h);
  return h;
}

void read_misfit_values(const unsigned char *p, size_t len, const MisfitParams &h, double *out, const char *fn) {
  if (len != misfit_serial_size(h.count)) not_serial(fn, StateKind::MisfitSummary);
  if (h.count > 0) std::memcpy(out, p + kMisfitSerialHeader, sizeof(double) * static_cast<size_t>(h.count));
  check_misfit_values(out, h.count);
}

}  // namespace striae
