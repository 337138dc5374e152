#include "planner/cli/posts_command.hpp"

#include <cstdio>

#include "planner/cli/exit_codes.hpp"
#include "postproc/post_processor_registry.hpp"

namespace tw::cli {

void addPostsCommand(CLI::App& app, int& exit_code) {
  CLI::App* command = app.add_subcommand(
      "posts", "List the post-processors (the writer names a job's outputs may use)");
  command->callback([&exit_code] {
    postproc::PostProcessorRegistry registry;
    postproc::registerBuiltInPostProcessors(registry);
    std::printf("%-16s %-10s %s\n", "name", "extension", "description");
    for (const std::string& name : registry.names()) {
      const postproc::PostProcessor& post = registry.get(name);
      std::printf("%-16s %-10s %s\n", name.c_str(), ("." + post.fileExtension()).c_str(),
                  post.description().c_str());
    }
    exit_code = kExitOk;
  });
}

}  // namespace tw::cli
