#pragma once

#include <Eigen/Geometry>
#include <map>
#include <string>
#include <vector>

namespace tw::planner {

/// One frame as written in a cell file: its name, its parent's name and its
/// pose in the parent, X_PF [m]. `line` locates it in the file for errors.
struct FrameDefinition {
  std::string name;
  std::string parent;
  Eigen::Isometry3d X_PF = Eigen::Isometry3d::Identity();
  int line = 0;
};

/// A tree of named rigid frames rooted at the implicit frame "world".
///
/// A value type: copy it to try a fixture move without touching the original.
/// Lookups are const and thread-safe; setPoseInParent() is not.
class FrameTree {
 public:
  static constexpr const char* kWorld = "world";

  /// A tree holding only "world".
  FrameTree();

  /// Builds the tree from definitions in any order (a frame may name a parent
  /// defined after it). Throws tw::InputError naming `source` and the line of
  /// the offending definition for an empty name, a redefinition of "world", a
  /// duplicate name, an unknown parent or a cycle.
  FrameTree(const std::vector<FrameDefinition>& definitions, const std::string& source);

  bool contains(const std::string& name) const;
  /// Every frame name including "world", sorted.
  std::vector<std::string> names() const;

  /// Pose of frame `name` in the world, X_WF. Throws tw::InputError for an
  /// unknown name.
  const Eigen::Isometry3d& X_W(const std::string& name) const;
  /// Pose of frame `b` in frame `a`: X_AB = X_WA⁻¹ · X_WB.
  Eigen::Isometry3d relative(const std::string& a, const std::string& b) const;
  /// Parent name and pose in the parent ("" and identity for "world").
  const std::string& parent(const std::string& name) const;
  const Eigen::Isometry3d& X_PF(const std::string& name) const;

  /// Moves frame `name` (and everything attached below it) to a new pose in
  /// its parent, e.g. after a fixture was moved or re-measured. Throws
  /// tw::InputError for "world" or an unknown name.
  void setPoseInParent(const std::string& name, const Eigen::Isometry3d& X_PF);

 private:
  struct Node {
    std::string parent;
    Eigen::Isometry3d X_PF = Eigen::Isometry3d::Identity();
    Eigen::Isometry3d X_WF = Eigen::Isometry3d::Identity();
  };

  const Node& node(const std::string& name) const;
  void updateWorldPoses();

  std::map<std::string, Node> nodes_;
  /// Parents before children, so one pass computes every X_WF.
  std::vector<std::string> order_;
};

}  // namespace tw::planner
