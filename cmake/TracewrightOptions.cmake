# Compiler settings for the project's own targets (never for dependencies).

if(TW_SANITIZE)
  add_compile_options(-fsanitize=address,undefined,float-cast-overflow -fno-omit-frame-pointer -fno-sanitize-recover=undefined,float-cast-overflow)
  add_link_options(-fsanitize=address,undefined,float-cast-overflow)
endif()

# tw_project_target(<target>): warnings as errors, include root at the top of
# the tree so that includes read "kinematics/arm_model.hpp".
#
# Hidden visibility: the template code our files instantiate (Eigen's above
# all) must never be exported from our executables. An exported instantiation
# interposes on the same-named one inside Debian's shared libraries (OMPL
# links its own Eigen code), so which code OMPL ran depended on what our
# program happened to instantiate: LBKPIECE1's random projection changed when
# a test that uses an SVD was linked into the same program.
function(tw_project_target target)
  target_compile_options(${target} PRIVATE -Wall -Wextra -Wpedantic -Werror
    -fvisibility=hidden -fvisibility-inlines-hidden)
  get_target_property(type ${target} TYPE)
  if(type STREQUAL "INTERFACE_LIBRARY")
    target_include_directories(${target} INTERFACE ${PROJECT_SOURCE_DIR})
  else()
    target_include_directories(${target} PUBLIC ${PROJECT_SOURCE_DIR})
  endif()
endfunction()
