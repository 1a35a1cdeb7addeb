#include <cstdio>
#include <filesystem>

#include "cli/commands.hpp"
#include "cli/model_loading.hpp"
#include "post/output_files.hpp"
#include "post/vtk_writer.hpp"
#include "solver/scattering_problem.hpp"

namespace lobe::cli {

int mesh_command(const std::string& model_path, const std::string& output, const std::vector<std::string>& set_options) {
  const Model model = load_model(model_path, set_options);
  std::filesystem::path target(output);
  if (target.extension() != ".vtu") throw InputError({"--output", 1, 1}, "the mesh file must end in .vtu");
  const std::filesystem::path directory = target.has_parent_path() ? target.parent_path() : std::filesystem::path(".");
  check_output_directory(directory);
  OutputFiles files(directory);
  const auto staging = files.staging_path(target.filename().string());
  if (!model.surfaces.empty()) {
    const ScatteringProblem problem(model);
    write_surface_vtu(staging, problem.surfaces);
  } else {
    const WireMesh mesh = mesh_wires(model);
    print_warnings(mesh);
    write_wire_vtu(staging, mesh);
  }
  for (const auto& path : files.commit()) std::printf("%s\n", path.string().c_str());
  return 0;
}

}  // namespace lobe::cli
