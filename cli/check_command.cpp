#include <cstdio>

#include <nlohmann/json.hpp>

#include "cli/commands.hpp"
#include "study/model_loading.hpp"
#include "post/run_summary.hpp"
#include "core/constants.hpp"
#include "solver/antenna_problem.hpp"
#include "solver/time_estimate.hpp"
#include "cli/progress_line.hpp"

namespace lobe::cli {
namespace {

/// Runs estimated to take longer than this are told so before they start.
constexpr double long_run_seconds = 600.0;

}  // namespace

void print_warnings(const std::vector<MeshWarning>& warnings) {
  for (const auto& w : warnings) std::fprintf(stderr, "%s\n", w.formatted().c_str());
}

void print_long_run_estimate(double unknowns, double frequencies, double cases, std::FILE* out) {
  const double seconds = estimated_solve_seconds(unknowns, frequencies * cases, long_run_seconds);
  if (seconds <= long_run_seconds) return;
  std::fprintf(out, "estimated time: about %s in all, %s per frequency (from this machine's measured matrix-multiply rate)\n",
              duration_text(seconds).c_str(), duration_text(seconds / (frequencies * cases)).c_str());
}

namespace {

/// What check prints, as one JSON document (schema lobe-check-summary, version 1, in
/// post/check_summary.schema.json).
std::string check_json(const Model& model, const AntennaProblem& problem) {
  using Json = nlohmann::ordered_json;
  Json warnings = Json::array();
  for (const auto* list : {&problem.mesh.warnings, &problem.surfaces.warnings})
    for (const auto& w : *list)
      warnings.push_back({{"file", w.where.file}, {"line", w.where.line}, {"column", w.where.column}, {"message", w.message}});
  Json substrate = nullptr;
  if (const auto& board = model.substrate)
    substrate = {{"name", board->name}, {"thickness_m", board->thickness}, {"permittivity", board->permittivity},
                 {"loss_tangent", board->loss_tangent}};
  // As in the printed form: estimated (by measuring this machine) only for runs that could
  // take longer than ten minutes; null otherwise.
  const double seconds =
      estimated_solve_seconds(problem.unknowns(), static_cast<double>(model.frequencies_hz.size()), long_run_seconds);
  Json doc{{"schema", "lobe-check-summary"},
           {"schema_version", 1},
           {"lobe_version", LOBE_VERSION},
           {"model", model.file},
           {"lit_by_a_plane_wave", model.wave.has_value()},
           {"wires", model.wires.size()},
           {"segments", problem.mesh.segments.size()},
           {"nodes", problem.mesh.nodes.size()},
           {"junctions", problem.mesh.junction_count},
           {"plates_and_bodies", model.surfaces.size()},
           {"triangles", problem.surfaces.mesh.triangles.size()},
           {"rwg_edges", problem.rwg.size()},
           {"wire_surface_junctions", problem.stars.size()},
           {"smallest_triangle_angle_deg",
            model.surfaces.empty() ? Json(nullptr) : Json(problem.surfaces.smallest_angle * 180 / pi)},
           {"unknowns", problem.unknowns()},
           {"ports", model.ports.size()},
           {"loads", model.loads.size()},
           {"feed_network_parts", model.network.size()},
           {"ground", problem.medium.name()},
           {"substrate", substrate},
           {"frequencies", {{"count", model.frequencies_hz.size()},
                            {"lowest_hz", model.frequencies_hz.front()},
                            {"highest_hz", model.highest_frequency()}}},
           {"matrix_bytes_per_frequency", system_matrix_bytes(static_cast<std::uint64_t>(problem.unknowns()))},
           {"long_run_estimate_seconds", seconds > long_run_seconds ? Json(seconds) : Json(nullptr)},
           {"warnings", warnings}};
  return doc.dump(2) + "\n";
}

}  // namespace

int check_command(const std::string& model_path, const std::vector<std::string>& set_options, bool json) {
  const Model model = load_model(model_path, set_options);
  const AntennaProblem problem(model);
  print_warnings(problem.mesh.warnings);
  print_warnings(problem.surfaces.warnings);
  if (json) {
    require_solvable(problem);
    std::fputs(check_json(model, problem).c_str(), stdout);
    return 0;
  }
  std::printf("%s: %s, %s, %s, %s, %s, %s, %s\n", model_path.c_str(), count_text(model.wires.size(), "wire").c_str(),
              count_text(problem.mesh.segments.size(), "segment").c_str(),
              count_text(problem.mesh.nodes.size(), "node").c_str(),
              count_text(problem.mesh.junction_count, "junction").c_str(),
              count_text(problem.unknowns(), "unknown").c_str(), model.wave ? "lit by a plane wave" : count_text(model.ports.size(), "port").c_str(),
              count_text(model.loads.size(), "load").c_str());
  if (!model.network.empty())
    std::printf("feed network: %s meeting the antenna at %s\n", count_text(model.network.size(), "part").c_str(),
                count_text(problem.network.antenna_ends().size(), "gap").c_str());
  if (problem.medium.has_real_ground())
    std::printf("ground: real, its near interaction by %s\n", problem.medium.ground_method().c_str());
  if (!model.surfaces.empty())
    std::printf("surfaces: %s, %s, %s, %s, smallest triangle angle %.1f deg\n",
                count_text(model.surfaces.size(), "plate or body", "plates and bodies").c_str(),
                count_text(problem.surfaces.mesh.triangles.size(), "triangle").c_str(),
                count_text(problem.rwg.size(), "RWG edge").c_str(),
                count_text(problem.stars.size(), "wire-to-surface junction").c_str(),
                problem.surfaces.smallest_angle * 180 / pi);
  require_solvable(problem);
  std::printf("dense matrices: %.3g MiB per frequency\n",
              static_cast<double>(system_matrix_bytes(static_cast<std::uint64_t>(problem.unknowns()))) / (1 << 20));
  // One frequency is named, not given as a range from itself to itself.
  const std::string frequencies =
      model.frequencies_hz.size() == 1
          ? "1 frequency, " + frequency_text(model.frequencies_hz.front())
          : count_text(model.frequencies_hz.size(), "frequency", "frequencies") + " from " +
                frequency_text(model.frequencies_hz.front()) + " to " + frequency_text(model.highest_frequency());
  std::printf("%s; ground %s; %s\n", frequencies.c_str(), problem.medium.name().c_str(),
              count_text(problem.mesh.warnings.size() + problem.surfaces.warnings.size(), "warning").c_str());
  if (const auto& board = model.substrate)
    std::printf("substrate %s: %.4g mm thick, relative permittivity %.4g, loss tangent %.4g, modelled as an infinite "
                "board on an infinite ground\n",
                board->name.c_str(), board->thickness * 1e3, board->permittivity, board->loss_tangent);
  print_long_run_estimate(problem.unknowns(), static_cast<double>(model.frequencies_hz.size()));
  return 0;
}

}  // namespace lobe::cli
