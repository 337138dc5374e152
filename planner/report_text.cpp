#include "planner/report_text.hpp"

namespace tw::planner {

std::string formatJoints(const kinematics::JointVector& q) {
  std::string text = "(";
  for (int j = 0; j < q.size(); ++j) {
    if (j > 0) text += ", ";
    text += formatSignificant(q[j], 17);
  }
  return text + ")";
}

std::string describeState(const collision::CollisionWorld& world,
                          const collision::StateResult& state) {
  return world.bodyName(state.body_a) + " against " + world.bodyName(state.body_b) + " (" +
         collision::toString(state.status) + ")";
}

}  // namespace tw::planner
