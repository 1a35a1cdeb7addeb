#pragma once
/// Reads model text into a Model. Every error is an InputError with file, line and column.
#include <string>
#include <vector>

#include "geometry/model.hpp"

namespace lobe {

/// A `--set NAME=VALUE` from the command line; `where` locates it for error messages.
struct Override {
  std::string name;
  std::string expression;
  SourceLocation where;
};

/// Largest model file read (far beyond any hand-written model).
constexpr std::size_t max_model_bytes = 64u << 20;

/// Parses a whole model. `file` is used in error locations only.
Model parse_model(const std::string& text, const std::string& file,
                  const std::vector<Override>& overrides = {});

/// Splits "NAME=VALUE" of a --set option (or of `option_name`, such as one case of a
/// --vary); the location names the option and its position. parse_model refuses a name
/// given twice.
Override parse_override(const std::string& option, int index, const std::string& option_name = "--set");

/// A `let` name and the values a sweep gives it, each as text for an override.
struct VariedName {
  std::string name;
  std::vector<std::string> values;  ///< override texts that give exactly the intended value
  std::vector<std::string> labels;  ///< the same values for people: in START's unit ("25 deg"), or as listed
};

/// NAME=START:STOP:STEP (inclusive; plain numbers, or lengths, frequencies or angles with
/// units, such as 160mm:175mm:5mm) or NAME=A,B,C (any override texts). At most
/// max_sweep_values values. Errors are located at --vary:INDEX:COLUMN.
VariedName parse_vary_option(const std::string& option, int index);
constexpr int max_sweep_values = 10000;

/// The unit a range was written in, for showing its values to people: "deg" and π/180
/// (its size in SI); empty and 1 for plain numbers.
struct ShownUnit {
  std::string name;
  Real scale = 1.0;
};
/// An SI value in that unit with ten significant digits ("25 deg"), which hides the
/// rounding of START + i·STEP.
std::string shown_text(Real value, const ShownUnit& shown);

/// A resolved value as model text, exact, in the model's own units: lengths in `units`,
/// angles in degrees, frequencies in MHz, everything else in SI ("161.5 mm", "45 deg").
std::string model_value_text(const ResolvedValue& value, const Model& model);

/// A `let` name a tuner may move between two values: NAME=MIN:MAX (plain numbers, or
/// lengths, frequencies or angles with units). `unit` is the suffix that makes a value
/// text an override (" m", " Hz", " rad" or empty). Errors at --vary:INDEX:COLUMN.
struct TunedName {
  std::string name;
  Real low = 0.0, high = 0.0;
  std::string unit;
  ShownUnit shown;  ///< MIN's unit
};
TunedName parse_tune_option(const std::string& option, int index);

/// A band given on the command line as LOW:HIGH with frequency units ("2.4GHz:2.4835GHz"),
/// named by its limits as written, spaces left out ("2.4GHz:2.4835GHz"), so that a report
/// says which band it means. Errors are located at --band:INDEX:COLUMN.
Band parse_band_option(const std::string& option, int index);

}  // namespace lobe
