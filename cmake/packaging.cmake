# Install rules and the Debian package (cpack -G DEB). The package holds the program, a
# manual page per command, bash completion, the demo models, the Python reader and engine, the
# documentation, and the libraries with their headers and an exported CMake package.
# scripts/check-package builds it, unpacks it into a temporary root and uses every part.
include(GNUInstallDirs)
include(CMakePackageConfigHelpers)

install(TARGETS lobe RUNTIME DESTINATION ${CMAKE_INSTALL_BINDIR})

find_program(LOBE_HELP2MAN help2man REQUIRED)
set(LOBE_MAN_DIR ${PROJECT_BINARY_DIR}/man)
add_custom_command(
  OUTPUT ${LOBE_MAN_DIR}/lobe.1.gz
  COMMAND ${CMAKE_COMMAND} -DLOBE=$<TARGET_FILE:lobe> -DOUT=${LOBE_MAN_DIR} -DVERSION=${PROJECT_VERSION}
          -P ${PROJECT_SOURCE_DIR}/cmake/man_pages.cmake
  DEPENDS lobe ${PROJECT_SOURCE_DIR}/cmake/man_pages.cmake
  COMMENT "Manual pages from each command's --help")
add_custom_target(lobe_man_pages ALL DEPENDS ${LOBE_MAN_DIR}/lobe.1.gz)
install(DIRECTORY ${LOBE_MAN_DIR}/ DESTINATION ${CMAKE_INSTALL_MANDIR}/man1)
install(FILES cli/lobe.bash-completion DESTINATION ${CMAKE_INSTALL_DATADIR}/bash-completion/completions RENAME lobe)
install(DIRECTORY models/ DESTINATION ${CMAKE_INSTALL_DATADIR}/lobe/models)
install(FILES README.md DEVELOPERS.md docs/hdf5_layout.md post/run_summary.schema.json post/check_summary.schema.json
              post/sweep_summary.schema.json post/compare_summary.schema.json
        DESTINATION ${CMAKE_INSTALL_DOCDIR})
install(FILES python/examples/plot_s11_and_pattern.py DESTINATION ${CMAKE_INSTALL_DOCDIR}/examples)
# Debian's own interpreter looks here for packages installed by the system.
install(DIRECTORY python/lobe DESTINATION lib/python3/dist-packages FILES_MATCHING PATTERN "*.py")
if(TARGET lobe_engine)
  install(TARGETS lobe_engine LIBRARY DESTINATION lib/python3/dist-packages)
endif()

set_target_properties(lobe_options PROPERTIES EXPORT_NAME options)
foreach(library IN LISTS LOBE_EXPORTED_LAYERS)
  set_target_properties(lobe_${library} PROPERTIES EXPORT_NAME ${library})
endforeach()
install(TARGETS lobe_options lobe_core lobe_geometry lobe_solver lobe_post lobe_study EXPORT lobeTargets
        ARCHIVE DESTINATION ${CMAKE_INSTALL_LIBDIR})
install(EXPORT lobeTargets NAMESPACE lobe:: DESTINATION ${CMAKE_INSTALL_LIBDIR}/cmake/lobe)
if(LOBE_MPI AND MPI_C_FOUND)
  set(LOBE_WITH_MPI ON)
else()
  set(LOBE_WITH_MPI OFF)
endif()
configure_package_config_file(cmake/lobeConfig.cmake.in ${PROJECT_BINARY_DIR}/lobeConfig.cmake
                              INSTALL_DESTINATION ${CMAKE_INSTALL_LIBDIR}/cmake/lobe)
write_basic_package_version_file(${PROJECT_BINARY_DIR}/lobeConfigVersion.cmake COMPATIBILITY SameMinorVersion)
install(FILES ${PROJECT_BINARY_DIR}/lobeConfig.cmake ${PROJECT_BINARY_DIR}/lobeConfigVersion.cmake
        DESTINATION ${CMAKE_INSTALL_LIBDIR}/cmake/lobe)

# Gmsh is loaded at run time (geometry/gmsh_library.hpp), so dpkg-shlibdeps cannot see it:
# the package that owns the library found at configure time is named here.
file(REAL_PATH "${GMSH_LIBRARY}" gmsh_file)
execute_process(COMMAND dpkg-query --search ${gmsh_file} OUTPUT_VARIABLE gmsh_owner ERROR_QUIET)
string(REGEX REPLACE ":.*" "" gmsh_owner "${gmsh_owner}")
set(CPACK_GENERATOR DEB)
set(CPACK_PACKAGE_NAME lobe)
set(CPACK_PACKAGE_VERSION ${PROJECT_VERSION})
set(CPACK_PACKAGE_CONTACT "lobe developers <lobe@localhost>")
set(CPACK_PACKAGE_DESCRIPTION_SUMMARY "method-of-moments antenna simulator for the CPU")
set(CPACK_PACKAGE_DESCRIPTION "Solves wires, plates and bodies (free space, over ground, printed on a board) for input \
impedance, VSWR, gain, patterns and axial ratio over whole bands; sweeps, tuning, matching networks, comparison with \
measurements, plots and reports. Results in HDF5 and CSV, with a Python reader.")
set(CPACK_DEBIAN_PACKAGE_SECTION science)
set(CPACK_DEBIAN_FILE_NAME DEB-DEFAULT)
set(CPACK_DEBIAN_PACKAGE_SHLIBDEPS ON)
set(CPACK_DEBIAN_PACKAGE_DEPENDS "${gmsh_owner}")
set(CPACK_DEBIAN_PACKAGE_RECOMMENDS "python3-h5py, python3-numpy")
set(CPACK_DEBIAN_PACKAGE_SUGGESTS "python3-pandas, python3-xarray, python3-h5netcdf, python3-matplotlib, paraview")
set(CPACK_PACKAGE_DIRECTORY ${PROJECT_BINARY_DIR}/packages)
include(CPack)
