#include "planner/cell/frame_tree.hpp"

#include <set>

#include "kinematics/common/input_error.hpp"

namespace tw::planner {

FrameTree::FrameTree() {
  nodes_.emplace(kWorld, Node{});
  order_.push_back(kWorld);
}

FrameTree::FrameTree(const std::vector<FrameDefinition>& definitions, const std::string& source)
    : FrameTree() {
  std::map<std::string, const FrameDefinition*> by_name;
  for (const FrameDefinition& definition : definitions) {
    if (definition.name.empty()) {
      throw InputError(source, definition.line, "a frame needs a non-empty name");
    }
    if (definition.name == kWorld) {
      throw InputError(source, definition.line,
                       "frame 'world' is the implicit root and cannot be defined");
    }
    if (!by_name.emplace(definition.name, &definition).second) {
      throw InputError(source, definition.line,
                       "frame '" + definition.name + "' is defined twice (first on line " +
                           std::to_string(by_name[definition.name]->line) + ")");
    }
  }
  for (const FrameDefinition& definition : definitions) {
    if (definition.parent != kWorld && by_name.count(definition.parent) == 0) {
      throw InputError(source, definition.line,
                       "frame '" + definition.name + "' has the unknown parent '" +
                           definition.parent +
                           "'; expected 'world' or a frame defined in the file");
    }
  }
  // Walk each frame up to the root in file order; a walk that comes back to
  // a frame it already passed is a cycle.
  std::set<std::string> placed = {kWorld};
  for (const FrameDefinition& definition : definitions) {
    std::vector<std::string> chain;
    std::string current = definition.name;
    while (placed.count(current) == 0) {
      for (const std::string& seen : chain) {
        if (seen == current) {
          std::string loop;
          for (const std::string& name : chain) loop += name + " -> ";
          throw InputError(source, definition.line,
                           "the frame tree has a cycle: " + loop + current +
                               "; every frame must lead up to 'world'");
        }
      }
      chain.push_back(current);
      current = by_name[current]->parent;
    }
    for (auto name = chain.rbegin(); name != chain.rend(); ++name) {
      const FrameDefinition& placed_definition = *by_name[*name];
      nodes_.emplace(*name, Node{placed_definition.parent, placed_definition.X_PF,
                                 Eigen::Isometry3d::Identity()});
      order_.push_back(*name);
      placed.insert(*name);
    }
  }
  updateWorldPoses();
}

bool FrameTree::contains(const std::string& name) const { return nodes_.count(name) != 0; }

std::vector<std::string> FrameTree::names() const {
  std::vector<std::string> result;
  for (const auto& [name, node] : nodes_) result.push_back(name);
  return result;
}

const FrameTree::Node& FrameTree::node(const std::string& name) const {
  const auto found = nodes_.find(name);
  if (found == nodes_.end()) throw InputError("unknown frame '" + name + "'");
  return found->second;
}

const Eigen::Isometry3d& FrameTree::X_W(const std::string& name) const { return node(name).X_WF; }

Eigen::Isometry3d FrameTree::relative(const std::string& a, const std::string& b) const {
  return X_W(a).inverse() * X_W(b);
}

const std::string& FrameTree::parent(const std::string& name) const { return node(name).parent; }

const Eigen::Isometry3d& FrameTree::X_PF(const std::string& name) const { return node(name).X_PF; }

void FrameTree::setPoseInParent(const std::string& name, const Eigen::Isometry3d& X_PF) {
  if (name == kWorld) throw InputError("frame 'world' is the root and cannot be moved");
  node(name);
  nodes_[name].X_PF = X_PF;
  updateWorldPoses();
}

void FrameTree::updateWorldPoses() {
  for (const std::string& name : order_) {
    Node& current = nodes_[name];
    current.X_WF = current.parent.empty() ? Eigen::Isometry3d::Identity()
                                          : nodes_[current.parent].X_WF * current.X_PF;
  }
}

}  // namespace tw::planner
