#include <memory>

#include "postproc/motion_text_post_processor.hpp"
#include "postproc/post_processor_registry.hpp"

namespace tw::postproc {

void registerBuiltInPostProcessors(PostProcessorRegistry& registry) {
  registry.add(std::make_unique<MotionTextPostProcessor>());
}

}  // namespace tw::postproc
