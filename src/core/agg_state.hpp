// Aggregate states as bytes: the kind tag that every in-memory aggregate state
// starts with, and the serialized forms that the glue's serialize and
// deserialize functions write and read.
//
// Why a tag: every aggregate's state is SQL type internal, so PostgreSQL lets
// a superuser wire one aggregate's transition function to another's combine,
// serialize or final function (CREATE AGGREGATE checks only the type
// "internal"). Without a check the other function would read a state of
// another layout, past its end. Each support function therefore checks the
// tag of the state it is handed (check_state_kind) before it reads anything
// else; the 8 bytes of the tag lie inside every palloc chunk (chunks are at
// least 8 bytes), so reading them is safe whatever the state is.
//
// Why the serialized forms live here: the reading and validation of bytes that
// arrive from outside is exactly what the fuzz harnesses (tests/fuzz) exercise,
// so it is pure C++ in src/core, and the glue only copies bytes in and out of
// PostgreSQL memory. Byte order is the machine's (states travel between
// processes of one server only); every read validates lengths before copying.
#pragma once

#include "dihedra.hpp"
#include "moment.hpp"
#include "stats.hpp"
#include "stress.hpp"

#include <cstddef>
#include <cstdint>
#include <initializer_list>

namespace striae {

// ---------------------------------------------------------------------------
// Kind tags
// ---------------------------------------------------------------------------

enum class StateKind : uint32_t {
  Fisher = 1,              // fisher_mean
  Tensor = 2,              // orientation_tensor, mean_plane, fold_axis
  Density = 3,             // density_grid
  StressLinear = 4,        // stress_inversion(fault_slip)
  RightDihedra = 5,        // right_dihedra
  KeepBootstrap = 6,       // stress_inversion(fault_slip, resamples, seed)
  KeepFocal = 7,           // focal_stress_inversion(fault_slip [, friction])
  KeepFocalBootstrap = 8,  // focal_stress_inversion(fault_slip, friction, resamples, seed)
  Phases = 9,              // stress_phases
  MisfitSummary = 10,      // misfit_summary
  MomentSum = 11,          // moment_tensor_sum
  FigureLayer = 12,        // net_great_circles, net_poles, net_lines, net_faults, net_hoeppener, net_pt_axes, net_dihedra
  FigureStack = 13,        // net_stack
  PartialMerge = 14,       // the two-phase merges over partial_state (partial.hpp)
};

// The first 8 bytes of every in-memory aggregate state.
struct StateTag {
  uint32_t magic;
  uint32_t kind;  // StateKind
};
static_assert(sizeof(StateTag) == 8, "the tag is the first 8 bytes of a state");
constexpr uint32_t kStateTagMagic = 0x67617453;  // "Stag" in memory on little-endian machines

inline StateTag state_tag(StateKind k) { return StateTag{kStateTagMagic, static_cast<uint32_t>(k)}; }

// True when the state's first 8 bytes are the tag of kind k (inline: the
// transition functions check every row).
inline bool state_is(const void *state, StateKind k) {
  StateTag t;
  std::memcpy(&t, state, sizeof t);
  return t.magic == kStateTagMagic && t.kind == static_cast<uint32_t>(k);
}

// The SQL aggregates whose state is of kind k, for messages ("fisher_mean").
const char *state_kind_aggregates(StateKind k);

// Throws Error(BadState) unless the state is tagged with one of the accepted
// kinds; returns the kind found. fn names the support function for the
// message, which also says whose state it takes and whose state it was handed.
StateKind check_state_kind(const void *state, const char *fn, std::initializer_list<StateKind> accepted);
inline void check_state_kind(const void *state, const char *fn, StateKind k) {
  if (!state_is(state, k)) check_state_kind(state, fn, {k});
}

// ---------------------------------------------------------------------------
// Serialized forms. Each starts with a 4-byte magic of its own. Readers throw
// Error(BadState) "<fn>: not a serialized state of this aggregate" for a
// wrong magic or length, and the validation error of the state otherwise.
// ---------------------------------------------------------------------------

// Fixed-size states: magic, then the raw struct.
constexpr size_t kFisherSerialSize = 4 + sizeof(FisherState);
constexpr size_t kTensorSerialSize = 4 + sizeof(TensorState);
constexpr size_t kStressSerialSize = 4 + sizeof(StressAccum);
void write_fisher_state(const FisherState &s, unsigned char *out);   // kFisherSerialSize bytes
void write_tensor_state(const TensorState &s, unsigned char *out);   // kTensorSerialSize bytes
void write_stress_state(const StressAccum &s, unsigned char *out);   // kStressSerialSize bytes
void read_fisher_state(const unsigned char *p, size_t len, FisherState &out, const char *fn);
void read_tensor_state(const unsigned char *p, size_t len, TensorState &out, const char *fn);
void read_stress_state(const unsigned char *p, size_t len, StressAccum &out, const char *fn);

// density_grid: magic, spacing (float8), m (uint64), m bin ids (uint32), m
// counts (uint64); the list is compacted (density.hpp, validate_bins).
struct DensitySerial {
  double spacing;
  uint64_t m;
};
size_t density_serial_size(size_t m);
void write_density_state(double spacing, const uint32_t *ids, const uint64_t *counts, size_t m,
                         unsigned char *out);
// Header: magic, exact length, m at most density_bin_count(), spacing valid.
// Then the caller allocates m entries and reads the list into them (validated).
DensitySerial read_density_header(const unsigned char *p, size_t len, const char *fn);
void read_density_bins(const unsigned char *p, size_t len, const DensitySerial &h, uint32_t *ids,
                       uint64_t *counts, const char *fn);

// right_dihedra: magic, DihedraHeader (24 bytes), node_count counts (int64).
size_t dihedra_serial_size(const DihedraHeader &h);
void write_dihedra_state(const DihedraHeader &h, const int64_t *counts, unsigned char *out);
// Header: magic, spacing valid, node_count matching it, reserved 0, data_count
// in range, exact length. Then the caller allocates node_count counts and
// reads them (validated with dihedra_validate).
DihedraHeader read_dihedra_header(const unsigned char *p, size_t len, const char *fn);
void read_dihedra_counts(const unsigned char *p, size_t len, const DihedraHeader &h, int64_t *counts,
                         const char *fn);

// The data-keeping stress inversions (bootstrap, joint focal inversion):
// magic, kind (int32: 1 bootstrap, 2 focal, 3 focal with bootstrap),
// resamples (int32), seed (int64), friction (float8; 0 = the default search),
// count (int64), then count SlipDatum (48 bytes each).
constexpr int32_t kKeepBootstrap = 1;
constexpr int32_t kKeepFocal = 2;
constexpr int32_t kKeepFocalBootstrap = 3;
constexpr size_t kKeepSerialHeader = 4 + 4 + 4 + 8 + 8 + 8;
struct KeepParams {
  int32_t kind;       // kKeep*
  int32_t resamples;  // bootstraps (0 otherwise)
  int64_t seed;       // bootstraps (0 otherwise)
  double friction;    // focal kinds: fixed value, or 0 = search; 0 for the bootstrap
  int64_t count;      // data kept
};
// BadState unless the kind is known, the parameters are what the transition
// functions accept for it, and 0 <= count <= kMaxBootstrapData.
void check_keep_params(const KeepParams &h);
// The state kind tag of a keep kind (kind checked).
StateKind keep_state_kind(int32_t kind);
size_t keep_serial_size(int64_t count);
void write_keep_state(const KeepParams &h, const SlipDatum *data, unsigned char *out);
// Header: magic, exact length, check_keep_params. Then the caller allocates
// count data and reads them (each checked with check_slip_datum: BadState).
KeepParams read_keep_header(const unsigned char *p, size_t len, const char *fn);
void read_keep_data(const unsigned char *p, size_t len, const KeepParams &h, SlipDatum *out,
                    const char *fn);
// BadState unless every datum passes check_slip_datum (polls for interrupts).
void check_keep_data(const SlipDatum *data, int64_t count);

// stress_phases: magic, phases (int32), starts (int32), seed (int64), count
// (int64), then count SlipDatum. The data are the group's, unsorted.
constexpr size_t kPhaseSerialHeader = 4 + 4 + 4 + 8 + 8;
struct PhaseParams {
  int32_t phases;
  int32_t starts;
  int64_t seed;   // any value
  int64_t count;  // data kept
};
// BadState unless phases and starts are what check_phase_options accepts and
// 0 <= count <= kMaxBootstrapData.
void check_phase_params(const PhaseParams &h);
size_t phase_serial_size(int64_t count);
void write_phase_state(const PhaseParams &h, const SlipDatum *data, unsigned char *out);
// Header: magic, exact length, check_phase_params. Then the caller allocates
// count data and reads them (each checked with check_slip_datum: BadState).
PhaseParams read_phase_header(const unsigned char *p, size_t len, const char *fn);
void read_phase_data(const unsigned char *p, size_t len, const PhaseParams &h, SlipDatum *out, const char *fn);
// BadState unless every datum passes check_slip_datum (polls for interrupts).
void check_phase_data(const SlipDatum *data, int64_t count);

// misfit_summary: magic, threshold (float8), undefined (int64), count (int64),
// then count misfits (float8, degrees). At most kMaxMisfits misfits a group
// (80 MB): the median needs them all.
constexpr int64_t kMaxMisfits = 10000000;
// Largest count of undefined misfits (counts convert to double exactly).
constexpr int64_t kMaxMisfitUndefined = int64_t(1) << 53;
constexpr size_t kMisfitSerialHeader = 4 + 8 + 8 + 8;
struct MisfitParams {
  double threshold;   // as check_misfit_threshold accepts
  int64_t undefined;  // data whose misfit is undefined
  int64_t count;      // misfits kept
};
// BadState unless the threshold is valid, 0 <= undefined <= kMaxMisfitUndefined
// and 0 <= count <= kMaxMisfits.
void check_misfit_params(const MisfitParams &h);
// BadState unless every misfit lies in 0..180 (polls for interrupts).
void check_misfit_values(const double *v, int64_t count);
size_t misfit_serial_size(int64_t count);
void write_misfit_state(const MisfitParams &h, const double *values, unsigned char *out);
MisfitParams read_misfit_header(const unsigned char *p, size_t len, const char *fn);
void read_misfit_values(const unsigned char *p, size_t len, const MisfitParams &h, double *out, const char *fn);

// moment_tensor_sum: magic, then the raw MomentAccum (moment_validate).
constexpr size_t kMomentSerialSize = 4 + sizeof(MomentAccum);
void write_moment_state(const MomentAccum &s, unsigned char *out);  // kMomentSerialSize bytes
void read_moment_state(const unsigned char *p, size_t len, MomentAccum &out, const char *fn);

}  // namespace striae
