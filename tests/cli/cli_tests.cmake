# CLI tests: each runs the zcorr binary and matches its output or exit code.
# zcorr_cli_test(NAME <name> ARGS <args...> [EXPECT_EXIT n] [MATCH regex] [STDIN file])
function(zcorr_cli_test)
  cmake_parse_arguments(T "" "NAME;EXPECT_EXIT;MATCH;STDIN" "ARGS" ${ARGN})
  if(NOT DEFINED T_EXPECT_EXIT)
    set(T_EXPECT_EXIT 0)
  endif()
  add_test(NAME cli.${T_NAME}
           COMMAND ${CMAKE_COMMAND} -DZCORR=$<TARGET_FILE:zcorr> "-DARGS=${T_ARGS}" -DEXPECT_EXIT=${T_EXPECT_EXIT}
                   "-DMATCH=${T_MATCH}" "-DSTDIN=${T_STDIN}" -P ${CMAKE_CURRENT_SOURCE_DIR}/cli/run_cli.cmake)
  set_tests_properties(cli.${T_NAME} PROPERTIES ENVIRONMENT "ZCORR_CASES_DIR=${PROJECT_SOURCE_DIR}/reference_cases")
endfunction()

set(CLI_DATA ${CMAKE_CURRENT_SOURCE_DIR}/cli/data)
file(GLOB ZCORR_CLI_TEST_LISTS ${CMAKE_CURRENT_SOURCE_DIR}/cli/*.tests.cmake)
foreach(f ${ZCORR_CLI_TEST_LISTS})
  include(${f})
endforeach()
