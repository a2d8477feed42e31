# Every command's --help ends with the caution, and every human-readable output
# ends with its one-line form (the house safety rule; for zcorr cases the line
# comes just before the closing "N passed, N failed").
foreach(cmd z convert cases demo props record verify quantities audit correct dewpoint)
  zcorr_cli_test(NAME help_caution_${cmd} ARGS ${cmd} --help MATCH "CAUTION: ")
endforeach()
foreach(sub export points answers)
  zcorr_cli_test(NAME help_caution_validate_${sub} ARGS validate ${sub} --help MATCH "CAUTION: ")
endforeach()
zcorr_cli_test(NAME caution_cases ARGS cases MATCH "CAUTION: check every result[^\n]*\n[0-9]+ passed, 0 failed\n$")
zcorr_cli_test(NAME caution_props ARGS props --gas "methane=0.95,ethane=0.03,nitrogen=0.02" --combustion-ref 25 --metering-ref 0 MATCH "CAUTION: check every result[^\n]*\n$")
zcorr_cli_test(NAME caution_convert ARGS convert --method gerg2008 --gas "methane=0.95,ethane=0.03,nitrogen=0.02"
               --V "1250 m3" --T "8 degC" --p "4.2 MPa" --base iso15 MATCH "CAUTION: check every result[^\n]*\n$")
if(EXISTS ${PROJECT_SOURCE_DIR}/engine/eval/gerg2008_adapter.cpp)
  zcorr_cli_test(NAME caution_verify ARGS verify --db ${CMAKE_CURRENT_BINARY_DIR}/cli_logs/demo/hollin-ford.db
                 MATCH "CAUTION: check every result[^\n]*\n$")
  zcorr_cli_test(NAME caution_quantities ARGS quantities --db ${CMAKE_CURRENT_BINARY_DIR}/cli_logs/demo/hollin-ford.db --period day
                 MATCH "CAUTION: check every result[^\n]*\n$")
  zcorr_cli_test(NAME caution_verify_json ARGS verify --db ${CMAKE_CURRENT_BINARY_DIR}/cli_logs/demo/hollin-ford.db --format json
                 MATCH "\"caution\": \"CAUTION: check every result")
  set_tests_properties(cli.caution_verify cli.caution_quantities cli.caution_verify_json PROPERTIES DEPENDS cli.demo_week)
endif()
