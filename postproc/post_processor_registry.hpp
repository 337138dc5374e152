#pragma once

#include <map>
#include <memory>
#include <string>
#include <vector>

#include "postproc/post_processor.hpp"

namespace tw::postproc {

/// Post-processors by name. Filled once (registerBuiltInPostProcessors()
/// plus any of the caller's own), then only read: reading is thread safe.
class PostProcessorRegistry {
 public:
  /// Adds `post_processor`; throws tw::InputError when its name is empty or
  /// already taken.
  void add(std::unique_ptr<PostProcessor> post_processor);
  /// The post-processor called `name`; throws tw::InputError listing the
  /// known names when there is none.
  const PostProcessor& get(const std::string& name) const;
  bool contains(const std::string& name) const;
  /// Every name, sorted.
  std::vector<std::string> names() const;
  bool empty() const { return post_processors_.empty(); }

 private:
  std::map<std::string, std::unique_ptr<PostProcessor>> post_processors_;
};

/// Registers every post-processor the project ships. Adding one is one line
/// here (see DEVELOPERS.md, "How to add a post-processor").
void registerBuiltInPostProcessors(PostProcessorRegistry& registry);

}  // namespace tw::postproc
