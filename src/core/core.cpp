// Definitions shared by the whole core (core.hpp).
#include "core.hpp"

namespace striae {

// Set by the glue when the library is loaded; null in unit tests.
InterruptHook interrupt_hook = nullptr;

}  // namespace striae
