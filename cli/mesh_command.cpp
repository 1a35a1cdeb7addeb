#include <cstdio>
#include <filesystem>

#include "cli/commands.hpp"
#include "study/output_checks.hpp"
#include "study/model_loading.hpp"
#include "post/output_files.hpp"
#include "post/vtk_writer.hpp"
#include "solver/antenna_problem.hpp"

namespace lobe::cli {

int mesh_command(const std::string& model_path, const std::string& output, const std::vector<std::string>& set_options) {
  const Model model = load_model(model_path, set_options);
  std::filesystem::path target(output);
  if (target.extension() != ".vtu") throw InputError({"--output", 1, 1}, "the mesh file must end in .vtu");
  const std::filesystem::path directory = target.has_parent_path() ? target.parent_path() : std::filesystem::path(".");
  check_output_directory(directory);
  OutputFiles files(directory);
  const auto staging = files.staging_path(target.filename().string());
  if (model.wave) {
    const SurfaceMeshReport surfaces = mesh_model_surfaces(model);
    print_warnings(surfaces.warnings);
    write_model_vtu(staging, WireMesh{}, surfaces);
  } else {
    const AntennaProblem problem(model);
    print_warnings(problem.mesh.warnings);
    print_warnings(problem.surfaces.warnings);
    write_model_vtu(staging, problem.mesh, problem.surfaces);
  }
  for (const auto& path : files.commit()) std::printf("%s\n", path.string().c_str());
  return 0;
}

}  // namespace lobe::cli
