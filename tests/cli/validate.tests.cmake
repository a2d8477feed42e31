# zcorr validate (export recomputation, test points and their answers).
# Data: tests/cli/data/validate (README.md there says how each file was made).
set(VAL ${CLI_DATA}/validate)

zcorr_cli_test(NAME validate.help ARGS validate --help
               MATCH "validate export --data.*validate points --method.*validate answers --file")
zcorr_cli_test(NAME validate.export_help ARGS validate export --help MATCH "component.methane = C1 \\[mol%\\].*Example:")
zcorr_cli_test(NAME validate.points_help ARGS validate points --help MATCH "Example:\n  zcorr validate points")
zcorr_cli_test(NAME validate.answers_help ARGS validate answers --help MATCH "Example:\n  zcorr validate answers")
zcorr_cli_test(NAME validate.no_subcommand ARGS validate EXPECT_EXIT 2)

# Unusable input: exit 2 with one line naming the field and the value (checked before any method is built).
zcorr_cli_test(NAME validate.export_missing_column
               ARGS validate export --data ${VAL}/exact_export.csv --map ${VAL}/missing_column.zmap --method gerg2008
               EXPECT_EXIT 2 MATCH "missing_column.zmap line [0-9]+ T: 'Flow Temp \\(C\\)' is not accepted; the data file has no such column")
zcorr_cli_test(NAME validate.export_unknown_key
               ARGS validate export --data ${VAL}/exact_export.csv --map ${VAL}/unknown_key.zmap --method gerg2008
               EXPECT_EXIT 2 MATCH "line 7 flow_rate: 'Q' is not accepted; unknown key")
zcorr_cli_test(NAME validate.export_missing_map
               ARGS validate export --data ${VAL}/exact_export.csv --map ${VAL}/no_such.zmap --method gerg2008
               EXPECT_EXIT 2 MATCH "--map: '[^']*no_such.zmap' is not accepted; the file cannot be opened")
zcorr_cli_test(NAME validate.export_missing_data
               ARGS validate export --data ${VAL}/no_such.csv --map ${VAL}/export.zmap --method gerg2008
               EXPECT_EXIT 2 MATCH "--data: '[^']*no_such.csv' is not accepted; the file cannot be opened")
zcorr_cli_test(NAME validate.export_bad_tolerance
               ARGS validate export --data ${VAL}/exact_export.csv --map ${VAL}/export.zmap --method gerg2008 --tolerance Zx=5
               EXPECT_EXIT 2 MATCH "--tolerance: 'Zx=5'")
zcorr_cli_test(NAME validate.answers_not_a_points_file ARGS validate answers --file ${VAL}/exact_export.csv
               EXPECT_EXIT 2 MATCH "header: 'point' is not accepted; this column is missing")
zcorr_cli_test(NAME validate.points_gross_method ARGS validate points --method sgerg88 --out -
               EXPECT_EXIT 2 MATCH "--method: 'sgerg88'")

# With the GERG-2008 method built in.
if(EXISTS ${PROJECT_SOURCE_DIR}/engine/eval/gerg2008_adapter.cpp)
  # An exact export (made by zcorr itself, README.md) validates; Zf, Zb and CF
  # were written to 10 digits, so it also passes at 0.01 ppm.
  zcorr_cli_test(NAME validate.export_exact
                 ARGS validate export --data ${VAL}/exact_export.csv --map ${VAL}/export.zmap --method gerg2008
                 MATCH "Z_f +50 +24 +0 .*RESULT: all 24 rows within tolerance of zcorr.s recomputation")
  zcorr_cli_test(NAME validate.export_exact_0.01ppm
                 ARGS validate export --data ${VAL}/exact_export.csv --map ${VAL}/export.zmap --method gerg2008
                      --tolerance-ppm 0.01 --tolerance V_b=0.1
                 MATCH "RESULT: all 24 rows within tolerance of zcorr.s recomputation")
  # The same export with Zf 0.02 % high on rows 4, 9 and 17: flagged, naming those rows.
  zcorr_cli_test(NAME validate.export_planted
                 ARGS validate export --data ${VAL}/planted_export.csv --map ${VAL}/export.zmap --method gerg2008
                 EXPECT_EXIT 1
                 MATCH "Z_f +50 +24 +3 +200\\.0 +(4|9|17) .*row 4 \\(line 5\\) 2026-11-03 03:00: Z_f reported [0-9.]+, recomputed [0-9.]+, \\+200\\.0 ppm  OUTSIDE.*row 9 \\(line 10\\) 2026-11-03 08:00: Z_f.*OUTSIDE.*row 17 \\(line 18\\) 2026-11-03 16:00: Z_f.*OUTSIDE.*RESULT: 3 of 24 rows outside tolerance of zcorr.s recomputation")
  zcorr_cli_test(NAME validate.export_planted_csv
                 ARGS validate export --data ${VAL}/planted_export.csv --map ${VAL}/export.zmap --method gerg2008 --format csv
                 EXPECT_EXIT 1 MATCH "\n3,4,2026-11-03 02:00,within,ok[^\n]*\n4,5,2026-11-03 03:00,outside,ok,")
  zcorr_cli_test(NAME validate.export_planted_json
                 ARGS validate export --data ${VAL}/planted_export.csv --map ${VAL}/export.zmap --method gerg2008 --format json
                 EXPECT_EXIT 1 MATCH "\"passed\": false.*\"rows_outside\": 3")
  # The export was made for 60 degF / 14.73 psia: checking it against 14.696 psia (a
  # flow computer configured with the wrong base pressure) fails every row in C.
  zcorr_cli_test(NAME validate.export_wrong_base
                 ARGS validate export --data ${VAL}/exact_export.csv --map ${VAL}/export.zmap --method gerg2008 --base us60f_14.696
                 EXPECT_EXIT 1 MATCH "C +50 +24 +24 .*RESULT: 24 of 24 rows outside tolerance of zcorr.s recomputation")
  # Base conditions must be stated: on the command line or in the map.
  zcorr_cli_test(NAME validate.export_no_base
                 ARGS validate export --data ${VAL}/exact_export.csv --map ${VAL}/no_base.zmap --method gerg2008
                 EXPECT_EXIT 2 MATCH "--base: '\\(missing\\)'")
  zcorr_cli_test(NAME validate.export_base_on_command_line
                 ARGS validate export --data ${VAL}/exact_export.csv --map ${VAL}/no_base.zmap --method gerg2008
                      --base-T "60 degF" --base-p "14.73 psia"
                 MATCH "RESULT: all [0-9]+ (rows|points) within tolerance of zcorr.s recomputation.*CAUTION")
  # A tolerance wider than the planted error accepts it.
  zcorr_cli_test(NAME validate.export_planted_wide
                 ARGS validate export --data ${VAL}/planted_export.csv --map ${VAL}/export.zmap --method gerg2008 --tolerance-ppm 250
                 MATCH "RESULT: all [0-9]+ (rows|points) within tolerance of zcorr.s recomputation.*CAUTION")
  # Points and answers: written, answered, compared (tests/cli/validate_roundtrip.sh).
  add_test(NAME cli.validate.points_answers_round_trip
           COMMAND sh ${CMAKE_CURRENT_SOURCE_DIR}/cli/validate_roundtrip.sh $<TARGET_FILE:zcorr>
                   ${CMAKE_CURRENT_BINARY_DIR}/validate_round_trip gerg2008)
  set_tests_properties(cli.validate.points_answers_round_trip PROPERTIES PASS_REGULAR_EXPRESSION "ok: validate points/answers round trip")
else()
  message(STATUS "zcorr validate CLI tests with GERG-2008: not registered (engine/eval/gerg2008_adapter.cpp absent)")
endif()
if(EXISTS ${PROJECT_SOURCE_DIR}/engine/eval/detail_adapter.cpp)
  add_test(NAME cli.validate.points_answers_round_trip_detail
           COMMAND sh ${CMAKE_CURRENT_SOURCE_DIR}/cli/validate_roundtrip.sh $<TARGET_FILE:zcorr>
                   ${CMAKE_CURRENT_BINARY_DIR}/validate_round_trip_detail detail)
  set_tests_properties(cli.validate.points_answers_round_trip_detail PROPERTIES PASS_REGULAR_EXPRESSION "ok: validate points/answers round trip")
endif()
