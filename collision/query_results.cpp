#include "collision/query_results.hpp"

namespace tw::collision {

const char* toString(StateStatus status) {
  switch (status) {
    case StateStatus::kFree:
      return "free";
    case StateStatus::kWithinMargin:
      return "within clearance margin";
    case StateStatus::kInCollision:
      return "in collision";
  }
  return "unknown";
}

}  // namespace tw::collision
