# Every dependency is a Debian package; scripts/install_deps.sh installs them.

find_package(Eigen3 3.4 REQUIRED NO_MODULE)
find_package(tinyxml2 REQUIRED)
find_package(CLI11 REQUIRED)

if(TW_BUILD_TESTS)
  find_package(Catch2 2 REQUIRED)
  include(Catch)
endif()

if(TW_BUILD_TESTS OR TW_BUILD_BENCHMARKS)
  # Orocos KDL is a reference in tests and benchmarks only. Its config sets
  # variables, not an imported target.
  find_package(orocos_kdl REQUIRED)
  add_library(tw_reference_kdl INTERFACE)
  target_include_directories(tw_reference_kdl SYSTEM INTERFACE ${orocos_kdl_INCLUDE_DIRS})
  target_link_libraries(tw_reference_kdl INTERFACE ${orocos_kdl_LIBRARIES})
endif()

if(TW_BUILD_BENCHMARKS)
  find_package(benchmark REQUIRED)
endif()

# Used by the collision, planner and postproc modules.
find_package(fcl REQUIRED)
find_package(assimp REQUIRED)
find_package(ompl REQUIRED)
find_package(nlohmann_json 3 REQUIRED)
