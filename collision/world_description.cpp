#include "collision/world_description.hpp"

namespace tw::collision {

const char* toString(BodyRole role) {
  switch (role) {
    case BodyRole::kObstacle:
      return "obstacle";
    case BodyRole::kWorkpiece:
      return "workpiece";
  }
  return "unknown";
}

}  // namespace tw::collision
