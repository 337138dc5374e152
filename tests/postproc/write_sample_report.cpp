// Writes the review report of the invented demo job (demo_report_program.hpp)
// to the path given as the only argument: the sample page until the
// command-line tool runs post-processors.
#include <exception>
#include <iostream>

#include "postproc/atomic_file.hpp"
#include "postproc/report/html_report_post_processor.hpp"
#include "tests/postproc/demo_report_program.hpp"

int main(int argc, char** argv) {
  if (argc != 2) {
    std::cerr << "usage: write_sample_report OUTPUT.html\n";
    return 2;
  }
  try {
    const tw::postproc::test::DemoReportJob job = tw::postproc::test::demoReportJob();
    tw::postproc::WriteOptions options;
    options.report_cell = job.cell;
    tw::postproc::writeProgramFile(tw::postproc::HtmlReportPostProcessor(), job.program, options,
                                   argv[1]);
  } catch (const std::exception& error) {
    std::cerr << error.what() << '\n';
    return 2;
  }
  std::cout << "wrote " << argv[1] << '\n';
  return 0;
}
