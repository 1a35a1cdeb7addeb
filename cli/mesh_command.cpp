#include <cstdio>
#include <filesystem>

#include "cli/commands.hpp"
#include "cli/standard_output.hpp"
#include "study/output_checks.hpp"
#include "study/model_loading.hpp"
#include "post/output_files.hpp"
#include "post/vtk_writer.hpp"
#include "solver/antenna_problem.hpp"

namespace lobe::cli {

int mesh_command(const std::string& model_path, const std::string& output, const std::vector<std::string>& set_options) {
  const Model model = load_model(model_path, set_options);
  std::filesystem::path target(output);
  const bool to_stdout = is_standard_output(output);
  if (!to_stdout && target.extension() != ".vtu") throw InputError({"--output", 1, 1}, "the mesh file must end in .vtu");
  auto write = [&](const std::filesystem::path& path) {
    if (model.wave) {
      const SurfaceMeshReport surfaces = mesh_model_surfaces(model);
      print_warnings(surfaces.warnings);
      write_model_vtu(path, WireMesh{}, surfaces);
    } else {
      const AntennaProblem problem(model);
      print_warnings(problem.mesh.warnings);
      print_warnings(problem.surfaces.warnings);
      write_model_vtu(path, problem.mesh, problem.surfaces);
    }
  };
  if (to_stdout) {
    write_through_standard_output(".vtu", write);
    return 0;
  }
  const std::filesystem::path directory = target.has_parent_path() ? target.parent_path() : std::filesystem::path(".");
  check_output_directory(directory);
  OutputFiles files(directory);
  write(files.staging_path(target.filename().string()));
  for (const auto& path : files.commit()) std::printf("%s\n", path.string().c_str());
  return 0;
}

}  // namespace lobe::cli
