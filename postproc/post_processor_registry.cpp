#include "postproc/post_processor_registry.hpp"

#include "kinematics/common/input_error.hpp"

namespace tw::postproc {

void PostProcessorRegistry::add(std::unique_ptr<PostProcessor> post_processor) {
  const std::string name = post_processor->name();
  if (name.empty()) throw InputError("post-processor registry: a post-processor has no name");
  if (contains(name)) {
    throw InputError("post-processor registry: the name '" + name + "' is registered twice");
  }
  post_processors_.emplace(name, std::move(post_processor));
}

const PostProcessor& PostProcessorRegistry::get(const std::string& name) const {
  const auto found = post_processors_.find(name);
  if (found == post_processors_.end()) {
    std::string known;
    for (const std::string& each : names()) known += (known.empty() ? "" : ", ") + each;
    throw InputError("unknown post-processor '" + name + "'; expected one of: " + known);
  }
  return *found->second;
}

bool PostProcessorRegistry::contains(const std::string& name) const {
  return post_processors_.count(name) > 0;
}

std::vector<std::string> PostProcessorRegistry::names() const {
  std::vector<std::string> result;
  for (const auto& entry : post_processors_) result.push_back(entry.first);
  return result;
}

}  // namespace tw::postproc
