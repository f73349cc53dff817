// Remedies for an operation that exceeds: the detailed keep-away distance of each tier (from the
// method-of-moments or screening evaluation), the PEP that would comply (exposure ratio ∝ power,
// linear field equations), and the duty factor or on-air share of the averaging window that
// would comply (average power ∝ duty × on-air share; OET 65 Supplement B).
#pragma once

#include <vector>

#include "core/remedy.hpp"
#include "exposure/evaluation.hpp"

namespace standoff::exposure {

// Empty unless the operation exceeds somewhere.
std::vector<Remedy> operation_remedies(const OperationResult& op);

}  // namespace standoff::exposure
