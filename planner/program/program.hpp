#pragma once

#include <Eigen/Geometry>
#include <cstdint>
#include <optional>
#include <string>
#include <variant>
#include <vector>

#include "kinematics/joint.hpp"

namespace tw::kinematics {
class ArmModel;
}

namespace tw::planner {

enum class MotionKind { kJointMove, kLinearMove, kCircularMove };
/// "joint-move", "linear-move" or "circular-move", as written in files.
const char* toString(MotionKind kind);

enum class SpeedKind {
  kTcpSpeed,            ///< speed of the TCP along its path [m/s]
  kJointSpeedFraction,  ///< fraction in (0, 1] of every joint's maximum velocity
};

struct MotionSpeed {
  SpeedKind kind = SpeedKind::kJointSpeedFraction;
  double value = 0.0;  ///< [m/s] for kTcpSpeed, unitless in (0, 1] for kJointSpeedFraction
};

/// The point a circular move passes through between its start and its target.
struct ViaPoint {
  /// Joint values at the via point, in the units and order of MotionRecord::q.
  kinematics::JointVector q_via;
  /// TCP pose at the via point in the record's reference frame R. Its position
  /// fixes the circle; its orientation is the one the arm has there as planned.
  /// The controller's orientation is slerped from the start to the target
  /// (postproc/FORMAT.md, "How a controller interpolates the records"), so the
  /// via orientation is information for dialects that want a whole via pose,
  /// not a third orientation to pass through.
  Eigen::Isometry3d X_RV = Eigen::Isometry3d::Identity();
};

/// One move of the arm, from where the previous motion ended to this target.
/// A joint move interpolates in joint space, a linear move moves the TCP on a
/// straight line, a circular move on the circle through its start (the
/// previous motion's target), its via point and its target; linear and
/// circular moves slerp the orientation from start to target by the fraction
/// of path length (planner/program/motion_path.hpp computes both).
struct MotionRecord {
  MotionKind kind = MotionKind::kJointMove;
  /// Target joint values in chain order, [rad] revolute, [m] prismatic; one per
  /// ProgramMetadata::joints entry.
  kinematics::JointVector q;
  /// Target pose of the TCP T in the reference frame R named by `frame`.
  Eigen::Isometry3d X_RT = Eigen::Isometry3d::Identity();
  std::string tool;   ///< id of the tool whose TCP X_RT means
  std::string frame;  ///< id of the reference frame R
  MotionSpeed speed;
  /// Blend radius [m] at the END of this motion, i.e. around this record's
  /// target: the path leaves this motion where the TCP comes within this
  /// distance of the target and joins the next motion where it leaves that
  /// sphere. 0 means stop exactly at the target; it must be 0 on the last
  /// motion, before a process event and before a change of tool, and the
  /// blend zones of neighbouring targets may not overlap.
  double blend_radius = 0.0;
  double start_time = 0.0;    ///< [s] from the start of the program
  double duration = 0.0;      ///< [s]
  /// The seam this motion belongs to (its approach, process moves, retract);
  /// empty for transits and other moves outside any seam.
  std::string seam;
  /// The IK branch of `q` in words, e.g. "shoulder front, elbow up, wrist
  /// not flipped"; empty when the planner does not say.
  std::string branch;
  /// Distance [m] from arm + tool to the nearest cell body (fixture,
  /// workpiece, obstacle) at the motion's target, when the planner has
  /// measured it; the arm's distances to its own links and tool are not
  /// part of it.
  std::optional<double> clearance;
  /// How far the target stays from the nearest singular configuration the
  /// planner checks, as an angle [rad] (for a spherical wrist: |axis 5|).
  std::optional<double> singularity_margin;
  /// The via point; present exactly when `kind` is kCircularMove.
  std::optional<ViaPoint> via;
};

enum class ProcessEventKind { kStart, kStop };
/// "process-on" or "process-off", as written in files.
const char* toString(ProcessEventKind kind);

/// Switches the process (arc, spray, bead) on or off at `time`, with the
/// named parameter set the controller holds (current, wire feed, flow, ...).
struct ProcessEvent {
  ProcessEventKind kind = ProcessEventKind::kStart;
  std::string parameter_set;
  std::string seam;   ///< seam the event belongs to; may be empty
  double time = 0.0;  ///< [s] from the start of the program
};

using ProgramRecord = std::variant<MotionRecord, ProcessEvent>;

/// SHA-256 of one input file (cell, job, mesh, seam list), lower-case hex.
struct InputFileHash {
  std::string path;
  std::string sha256;
};

/// One joint of the arm the program was made for, with its position limits.
struct ProgramJoint {
  std::string name;
  kinematics::JointType type = kinematics::JointType::kRevolute;
  double lower = 0.0;  ///< [rad] or [m]
  double upper = 0.0;  ///< [rad] or [m]
};

enum class LengthUnit { kMillimetre, kMetre };
enum class AngleUnit { kDegree, kRadian };
/// "mm" / "m" and "deg" / "rad", as written in files.
const char* toString(LengthUnit unit);
const char* toString(AngleUnit unit);

/// Units the output files use; the program itself is always SI. Time is
/// always written in seconds.
struct FileUnits {
  LengthUnit length = LengthUnit::kMillimetre;
  AngleUnit angle = AngleUnit::kDegree;
};

struct ProgramMetadata {
  std::string job;        ///< job name
  std::string arm;        ///< arm id
  std::string generator;  ///< generator name and version, e.g. "tracewright 0.1.0"
  std::uint64_t seed = 0;
  std::vector<InputFileHash> inputs;
  std::vector<ProgramJoint> joints;
  FileUnits units;
};

/// The generated, timed motion sequence of one job, in SI units. Plain data;
/// findProgramProblem() says whether it is consistent.
struct Program {
  ProgramMetadata metadata;
  std::vector<ProgramRecord> records;
  /// Planner warnings to pass on to the reader of every output.
  std::vector<std::string> warnings;
};

/// The first inconsistency of a program. `record` is the index into
/// Program::records, or -1 for the metadata and warnings.
struct ProgramProblem {
  int record = -1;
  std::string message;
};

/// Checks what every writer relies on: joints named, unique, lower < upper;
/// every motion with one finite value per joint within its limits, a proper
/// rotation, non-empty tool and frame, a positive speed (a fraction at most
/// 1), non-negative duration; start times non-decreasing; process events
/// alternating on/off with matching parameter sets and no process left on
/// at the end; hashes of 64 lower-case hex digits; no control characters in
/// any text.
///
/// Circular moves: a via point exactly on circular moves, with joints and
/// pose checked like a target; a circular move follows a motion with the
/// same tool and frame (its start), and start, via and target are at least
/// kArcPointSeparation apart and off one straight line by at least as much
/// (planner/program/motion_path.hpp).
///
/// Blends: finite and ≥ 0; 0 on the last motion, on a motion followed by a
/// process event before the next motion (a blend may not round a corner
/// where the process switches) and on a motion followed by one with another
/// tool (the radius is measured at the TCP); for consecutive motions in the
/// same frame, blend of the first + blend of the second ≤ the distance
/// between their targets (+ kBlendOverlapSlack), so that blend zones do not
/// overlap. Returns nullopt for a consistent program.
std::optional<ProgramProblem> findProgramProblem(const Program& program);

/// Throws tw::InputError naming `source` and the record when
/// findProgramProblem() finds a problem.
void checkProgram(const Program& program, const std::string& source);

/// Time from the program start to the end of its last motion or event [s].
double cycleTime(const Program& program);

/// The joints of `arm` (names, types, position limits) for
/// ProgramMetadata::joints.
std::vector<ProgramJoint> programJoints(const kinematics::ArmModel& arm);

/// Distance of each joint value to its nearer limit, per joint [rad] or [m];
/// negative outside the limits. `q` holds one value per metadata joint.
kinematics::JointVector jointLimitMargins(const ProgramMetadata& metadata,
                                          const kinematics::JointVector& q);

}  // namespace tw::planner
