#include <memory>

#include "postproc/motion_text/motion_text_post_processor.hpp"
#include "postproc/post_processor_registry.hpp"
#include "postproc/report/html_report_post_processor.hpp"
#include "postproc/tables/joint_table_post_processor.hpp"
#include "postproc/tables/summary_post_processor.hpp"
#include "postproc/template/template_post_processor.hpp"

namespace tw::postproc {

void registerBuiltInPostProcessors(PostProcessorRegistry& registry) {
  registry.add(std::make_unique<MotionTextPostProcessor>());
  registry.add(std::make_unique<JointTablePostProcessor>());
  registry.add(std::make_unique<SummaryPostProcessor>());
  registry.add(std::make_unique<TemplatePostProcessor>());
  registry.add(std::make_unique<HtmlReportPostProcessor>());
}

}  // namespace tw::postproc
