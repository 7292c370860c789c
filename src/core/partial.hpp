// Two-phase aggregation: the partial_state value.
//
// PostgreSQL 15's postgres_fdw pushes a whole aggregate to a shard but never
// half of one, so a GROUP BY that cuts across partitions (a grid cell spanning
// two regions, a depth bin) would ship every row to the coordinator. The
// two-phase forms avoid that: X_partial(...) on a shard returns its aggregate
// state as a value of SQL type partial_state, which travels like any value
// (text through postgres_fdw, binary through COPY and the binary protocol), and
// X(partial_state) on the coordinator merges the states of a group with the
// aggregate's own combine function and runs its own final function. A merge of
// partials therefore equals the one-phase aggregate over the same rows up to the
// order of floating-point additions (nothing where the state is integer counts
// or kept data, which the final functions sort).
//
// A partial_state value (after PostgreSQL's varlena header), little-endian:
//    0  StateTag: magic "Stag" and the state kind (agg_state.hpp)   8 bytes
//    8  input: what the rows were (PartialInput)                     4
//   12  reserved, 0                                                  4
//   16  the serialized state, exactly as the aggregate's serialize
//       function writes it (agg_state.hpp: its own 4-byte magic, then
//       the state), so one reader validates both
// Its text form is "<kind>/<input>:<base64 of the serialized state>", e.g.
// "stress_inversion/fault_slip:U1NUMQ...", base64 as RFC 4648 section 4
// (padding required, no line breaks, unused bits zero), so every value has
// exactly one text. Text and binary input accept exactly the same values:
// both end in check_partial on the same bytes.
#pragma once

#include "agg_state.hpp"

#include <cstddef>
#include <cstdint>
#include <string>

namespace striae {

// The aggregate's first argument type.
enum class PartialInput : uint32_t { Lineation = 1, Plane = 2, FaultSlip = 3 };

constexpr size_t kPartialHeader = 16;

// The kinds a partial can carry: every aggregate state kind with a serialized
// form in agg_state.hpp (not the figure layers, nor PartialMerge itself).
bool partial_kind_supported(StateKind k);
// True when a partial aggregate makes this pair: lineation or plane for
// fisher_mean, orientation_tensor and density_grid, fault_slip otherwise.
bool partial_pair_valid(StateKind k, PartialInput in);

// Names in the text form and in messages: "fisher_mean", "lineation", and
// "fisher_mean/lineation".
const char *partial_kind_name(StateKind k);  // kind must be supported
const char *partial_input_name(PartialInput in);
std::string partial_label(StateKind k, PartialInput in);

// What a partial says about itself: its kind and input, the parameters two
// partials must share to be merged, and the number of data it summarises.
struct PartialInfo {
  StateKind kind;
  PartialInput input;
  int64_t count;      // data summarised (NULL rows not counted; misfit_summary: defined + undefined)
  double spacing;     // density_grid, right_dihedra (else 0)
  double friction;    // focal kinds: the fixed friction, 0 = the default search (else 0)
  int32_t resamples;  // bootstraps (else 0)
  int32_t phases;     // stress_phases (else 0)
  int32_t starts;     // stress_phases (else 0)
  int32_t weighted;   // moment_tensor_sum: -1 no data yet, 0 unit moments, 1 from magnitudes (else 0)
  int64_t seed;       // bootstraps, stress_phases (else 0)
  double threshold;   // misfit_summary (else 0)
};

// The 16-byte header of a partial (kind and input must form a valid pair).
void write_partial_header(StateKind k, PartialInput in, unsigned char *out);

// The description of the partial in bytes p[0..len): its header and the header
// (for fixed-size kinds the whole state) of its serialized state, validated;
// the body of a variable-length state is not read (the deserialize that reads
// it validates it). Error(BadState) naming fn for anything wrong.
PartialInfo read_partial_info(const unsigned char *p, size_t len, const char *fn);
// The same, with the whole serialized state validated exactly as the
// aggregate's deserialize function validates it. Polls for interrupts.
PartialInfo check_partial(const unsigned char *p, size_t len, const char *fn);

// The description of two partials merged: Error(InvalidParameter) naming fn
// unless both are of the same kind and input and share their parameters
// (spacing, friction, resamples and seed, phases and starts, threshold;
// weighted and unweighted moment sums do not mix); counts add.
PartialInfo merge_partial_info(const PartialInfo &a, const PartialInfo &b, const char *fn);

// ---- text form -------------------------------------------------------------

// Length of the text of the partial in p[0..len) (without the NUL; a valid
// header is assumed).
size_t partial_text_size(const unsigned char *p, size_t len);
// Writes the text of the partial in p[0..len) and a NUL: out holds
// partial_text_size(p, len) + 1 chars.
void write_partial_text(const unsigned char *p, size_t len, char *out);

// Text input in two steps, so the caller allocates the value from a checked
// size: scan_partial_text checks the label and the base64 alphabet, padding
// and length (Error(InvalidText) otherwise) and returns the size of the value;
// decode_partial_text writes the value (header and decoded state) into out and
// validates it with check_partial (Error(InvalidText) with the reason).
struct PartialText {
  StateKind kind;
  PartialInput input;
  const char *b64;  // the base64 part of the input
  size_t b64_len;
  size_t size;  // bytes of the value: kPartialHeader + decoded length
};
PartialText scan_partial_text(const char *s);
PartialInfo decode_partial_text(const char *s, const PartialText &t, unsigned char *out);

// Binary input (the value's bytes as send writes them): check_partial with
// any failure reported as Error(InvalidBinary).
PartialInfo check_partial_binary(const unsigned char *p, size_t len);

// Base64 (RFC 4648 section 4), exposed for the unit tests: encoded length,
// encoder, and a strict decoder (false on a character outside the alphabet,
// bad padding, a length not a multiple of 4 or non-zero unused bits).
size_t base64_size(size_t len);
void base64_encode(const unsigned char *p, size_t len, char *out);
bool base64_decode(const char *s, size_t n, unsigned char *out, size_t &out_len);

}  // namespace striae
