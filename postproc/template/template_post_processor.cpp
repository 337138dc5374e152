#include "postproc/template/template_post_processor.hpp"

#include "kinematics/common/input_error.hpp"
#include "postproc/template/program_template.hpp"

namespace tw::postproc {

void TemplatePostProcessor::write(const planner::Program& program, const WriteOptions& options,
                                  std::ostream& out) const {
  planner::checkProgram(program, options.output_name);
  if (options.template_file.empty()) {
    throw InputError(options.output_name, 0,
                     "the template post-processor needs a template file (WriteOptions::template_file)");
  }
  ProgramTemplate::load(options.template_file).render(program, out);
}

}  // namespace tw::postproc
