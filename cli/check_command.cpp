#include <cstdio>

#include "cli/commands.hpp"
#include "cli/model_loading.hpp"
#include "solver/wire_problem.hpp"

namespace lobe::cli {

void print_warnings(const WireMesh& mesh) {
  for (const auto& w : mesh.warnings)
    std::fprintf(stderr, "%s:%d:%d: warning: %s\n", w.where.file.c_str(), w.where.line, w.where.column, w.message.c_str());
}

int check_command(const std::string& model_path, const std::vector<std::string>& set_options) {
  const Model model = load_model(model_path, set_options);
  const WireProblem problem(model);
  print_warnings(problem.mesh);
  std::printf("%s: %zu wires, %zu segments, %zu nodes, %d junctions, %d unknowns, %zu ports, %zu loads\n",
              model_path.c_str(), model.wires.size(), problem.mesh.segments.size(), problem.mesh.nodes.size(),
              problem.mesh.junction_count, problem.basis.size(), model.ports.size(), model.loads.size());
  std::printf("frequencies: %zu from %.6g Hz to %.6g Hz; ground %s; %zu warnings\n", model.frequencies_hz.size(),
              model.frequencies_hz.front(), model.highest_frequency(), model.ground_perfect ? "perfect" : "none",
              problem.mesh.warnings.size());
  return 0;
}

}  // namespace lobe::cli
