#pragma once

#include <optional>
#include <string>

#include "collision/collision_world.hpp"
#include "kinematics/arm_model.hpp"
#include "planner/transit/joint_path.hpp"

namespace tw::planner::test {

/// The sample arm (samples/arms/weld_arm_1400.xml), loaded once.
const kinematics::ArmModel& sampleArm();

/// An invented demo cell around the sample arm, built directly as a
/// collision::WorldDescription (lengths [m], base at the world origin): a
/// torch on the flange, a table in front of the arm and an 8 cm wall
/// standing on it across the y = 0 plane, so that the two demo
/// configurations on either side of the wall are not joined by a straight
/// joint-space segment. `wall_thickness` [m] thins the wall.
collision::WorldDescription demoCellDescription(double wall_thickness = 0.08);

/// The demo cell without its wall but with a fence only 5 mm thick and
/// 0.6 m high in its place: thin enough that OMPL's default fixed-resolution
/// motion check steps over it between the two demo configurations.
collision::WorldDescription thinFenceDescription();

/// Torch tip over the table on the −y side of the wall and on the +y side.
kinematics::JointVector demoStart();
kinematics::JointVector demoGoal();

/// Dense independent re-check, separate from the planner's segment check:
/// every segment is cut into pieces over which, by CollisionWorld::
/// motionBound, no point of the arm or tool moves more than `step` [m], and
/// every state between pieces is checked with `world`'s margins. Returns the
/// index of the first colliding segment, or nullopt when the path is free.
std::optional<int> firstCollidingSegment(const collision::CollisionWorld& world,
                                         const JointPath& path, double step = 0.001);

/// The same description with both margins (cell and self) scaled by
/// `factor`, for a dense re-check world: a segment valid by checkSegment
/// keeps at least half of each pair's margin (collision_world.hpp), so 0.4
/// of it must hold everywhere.
collision::WorldDescription withMargin(collision::WorldDescription description, double factor);

}  // namespace tw::planner::test
