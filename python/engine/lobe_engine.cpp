// lobe's solver inside a Python process (pybind11), for optimisers that call it many
// times: a model's text in, its port quantities, beam figures and band figures out, with no
// files written. python/lobe/engine.py turns the result into labelled arrays (lobe.solve).
#include <pybind11/numpy.h>
#include <pybind11/pybind11.h>
#include <pybind11/stl.h>

#include <limits>
#include <map>
#include <string>
#include <vector>

#include "core/input_error.hpp"
#include "geometry/model_parser.hpp"
#include "post/band_report.hpp"
#include "post/beam_band_report.hpp"
#include "post/frequency_result.hpp"
#include "solver/antenna_problem.hpp"
#include "study/memory_run.hpp"

namespace py = pybind11;

namespace lobe {
namespace {

template <class Value>
py::array_t<Value> array(const std::vector<Value>& values, const std::vector<py::ssize_t>& shape) {
  py::array_t<Value> out(shape);
  std::copy(values.begin(), values.end(), out.mutable_data());
  return out;
}

/// Solves `text` (with `set` overriding its `let` values) at every frequency of the model.
py::dict solve(const std::string& text, const std::map<std::string, std::string>& set, bool every_frequency,
               const std::string& name) {
  std::vector<Override> overrides;
  for (const auto& [let, value] : set) overrides.push_back(parse_override(let + "=" + value, static_cast<int>(overrides.size()) + 1));
  const Model model = parse_model(text, name, overrides);
  if (model.wave) throw InputError({name, 1, 1}, "a scatterer lit by a wave: solve it with `lobe run`; lobe.solve takes antennas");
  const AntennaProblem problem(model);
  require_solvable(problem);
  const std::size_t nf = model.frequencies_hz.size(), np = model.ports.size();
  std::vector<FrequencyResult> results;
  {
    py::gil_scoped_release free_python;  // the solve runs on every core; other Python threads may go on
    results = solve_in_memory(problem, every_frequency ? FrequencySampling::every : FrequencySampling::adaptive);
  }
  std::vector<Complex> impedance, reflection, s_matrix;
  std::vector<Real> vswr, return_loss;
  std::vector<int> solved;
  for (const auto& r : results) {
    for (const auto& p : r.ports) {
      impedance.push_back(p.impedance);
      reflection.push_back(p.reflection);
      vswr.push_back(p.vswr);
      return_loss.push_back(p.return_loss_db);
    }
    for (std::size_t i = 0; i < np; ++i)
      for (std::size_t j = 0; j < np; ++j) s_matrix.push_back(r.s_matrix(i, j));
    solved.push_back(r.interpolated ? 0 : 1);
  }
  const auto f = static_cast<py::ssize_t>(nf), p = static_cast<py::ssize_t>(np);
  py::dict out;
  out["frequency_hz"] = array(model.frequencies_hz, {f});
  std::vector<std::string> ports, bands;
  for (const auto& port : model.ports) ports.push_back(port.name);
  out["ports"] = ports;
  out["impedance_ohm"] = array(impedance, {f, p});
  out["reflection"] = array(reflection, {f, p});
  out["vswr"] = array(vswr, {f, p});
  out["return_loss_db"] = array(return_loss, {f, p});
  out["s_matrix"] = array(s_matrix, {f, p, p});
  out["solved"] = array(solved, {f});
  const BeamCurves curves = beam_curves(results);
  py::dict beam;
  for (const auto& kind : beam_figure_kinds()) {
    std::vector<Real> values;
    for (const auto& v : curves.values.at(kind.name)) values.push_back(v.value_or(std::numeric_limits<Real>::quiet_NaN()));
    beam[py::str(kind.dataset)] = array(values, {f});
  }
  out["beam"] = beam;
  // Per band: every named figure, per port for the port figures (None where undefined).
  py::dict band_figures;
  for (const auto& band : model.bands) {
    const auto figures = run_band_figures(results, np, band);
    py::dict named;
    for (const auto& figure : band_figure_names()) {
      py::list per_port;
      for (std::size_t k = 0; k < (is_beam_figure(figure) ? 1 : np); ++k) {
        const auto value = figures ? band_figure((*figures)[k], figure) : std::nullopt;
        per_port.append(value ? py::object(py::float_(*value)) : py::object(py::none()));
      }
      named[py::str(figure)] = is_beam_figure(figure) ? per_port[0] : py::object(per_port);
    }
    band_figures[py::str(band.name)] = named;
  }
  out["band_figures"] = band_figures;
  return out;
}

}  // namespace
}  // namespace lobe

PYBIND11_MODULE(lobe_engine, module) {
  module.doc() = "lobe's solver in-process: solve(model_text, set={}, every_frequency=False, name='model')";
  // Bad input is a ValueError whose message is lobe's own FILE:LINE:COL: message.
  py::register_exception_translator([](std::exception_ptr thrown) {
    try {
      if (thrown) std::rethrow_exception(thrown);
    } catch (const lobe::InputError& e) {
      PyErr_SetString(PyExc_ValueError, e.formatted().c_str());
    }
  });
  module.def("solve", &lobe::solve, py::arg("model"), py::arg("set") = std::map<std::string, std::string>{},
             py::arg("every_frequency") = false, py::arg("name") = "model",
             "Solves a model's text at its frequencies; returns a dict of numpy arrays and band figures.");
}
