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

/// Parses a whole model. `file` is used in error locations only.
Model parse_model(const std::string& text, const std::string& file,
                  const std::vector<Override>& overrides = {});

/// Splits "NAME=VALUE" of a --set option; the location names the option's position.
Override parse_override(const std::string& option, int index);

/// A band given on the command line as LOW:HIGH with frequency units ("2.4GHz:2.4835GHz"),
/// named "option-INDEX". Errors are located at --band:INDEX:COLUMN.
Band parse_band_option(const std::string& option, int index);

}  // namespace lobe
