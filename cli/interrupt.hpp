#pragma once
/// Ctrl-C and SIGTERM as a study's cancel token: the study stops at its next frequency and
/// keeps what it finished.
#include "study/study_control.hpp"

namespace lobe::cli {

/// Installs the handlers for SIGINT and SIGTERM (once) and returns the token they set.
const CancelToken& cancel_on_interrupt();

}  // namespace lobe::cli
