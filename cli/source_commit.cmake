# Writes OUT, a header defining LOBE_COMMIT: the source tree's git commit (with "+changes"
# when the tree differs from it), or "unknown" outside a git checkout. Run at every build;
# the header is rewritten only when the text changes, so nothing recompiles needlessly.
execute_process(COMMAND git -C "${SOURCE}" rev-parse --short=12 HEAD OUTPUT_VARIABLE commit
                OUTPUT_STRIP_TRAILING_WHITESPACE RESULT_VARIABLE failed ERROR_QUIET)
if(failed OR commit STREQUAL "")
  set(commit "unknown")
else()
  execute_process(COMMAND git -C "${SOURCE}" status --porcelain --untracked-files=no OUTPUT_VARIABLE changes ERROR_QUIET)
  if(NOT changes STREQUAL "")
    set(commit "${commit}+changes")
  endif()
endif()
set(text "#pragma once\n#define LOBE_COMMIT \"${commit}\"\n")
if(EXISTS "${OUT}")
  file(READ "${OUT}" old)
endif()
if(NOT old STREQUAL text)
  file(WRITE "${OUT}" "${text}")
endif()
