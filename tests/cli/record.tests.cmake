# Interval log commands: verify (exit 0 clean / 1 findings naming the row /
# 2 unreadable), quantities, and the record command's refusals.
set(LOG_DIR ${CMAKE_CURRENT_BINARY_DIR}/cli_logs)
file(MAKE_DIRECTORY ${LOG_DIR})
add_test(NAME cli.setup_logs
         COMMAND ${CMAKE_COMMAND} -E chdir ${LOG_DIR} sh -c
                 "$<TARGET_FILE:make_test_log> clean.db && $<TARGET_FILE:make_test_log> tampered.db --tamper > tampered.seq && printf 'plain text, not a database, long enough to fill a header page of sqlite. . . . .' > garbage.db")
set_tests_properties(cli.setup_logs PROPERTIES FIXTURES_SETUP cli_logs)

zcorr_cli_test(NAME verify_clean ARGS verify --db ${LOG_DIR}/clean.db MATCH "result    clean")
zcorr_cli_test(NAME verify_tampered ARGS verify --db ${LOG_DIR}/tampered.db EXPECT_EXIT 1
               MATCH "first bad row: interval seq 515 .*changed  interval seq 515")
zcorr_cli_test(NAME verify_json ARGS verify --db ${LOG_DIR}/tampered.db --format json EXPECT_EXIT 1 MATCH "\"kind\": \"changed\"")
zcorr_cli_test(NAME verify_missing ARGS verify --db ${LOG_DIR}/missing.db EXPECT_EXIT 2 MATCH "no such log file")
zcorr_cli_test(NAME verify_garbage ARGS verify --db ${LOG_DIR}/garbage.db EXPECT_EXIT 2 MATCH "not a database")
zcorr_cli_test(NAME quantities_day ARGS quantities --db ${LOG_DIR}/clean.db MATCH "TEST-1      2026-03-02 .*1 record")
zcorr_cli_test(NAME quantities_hour_csv ARGS quantities --db ${LOG_DIR}/clean.db --period hour --format csv
               MATCH "TEST-1,hour,2026-03-02,2026-03-02T06:00:00Z,2026-03-02T07:00:00Z,60,3600,0,")
set_tests_properties(cli.verify_clean cli.verify_tampered cli.verify_json cli.verify_missing cli.verify_garbage cli.quantities_day
                     cli.quantities_hour_csv PROPERTIES FIXTURES_REQUIRED cli_logs)

zcorr_cli_test(NAME record_help ARGS record --help MATCH "integration \\(per_sample \\| average_then_correct\\)")
zcorr_cli_test(NAME record_bad_config ARGS record --db ${LOG_DIR}/x.db --config ${CLI_DATA}/bad_point.conf --samples -
               EXPECT_EXIT 2 MATCH "bad_point.conf:4 meter_factor: 'one' is not accepted")
if(EXISTS ${PROJECT_SOURCE_DIR}/engine/eval/gerg2008_adapter.cpp)
  # Each ctest run records into a fresh log.
  add_test(NAME cli.record_fresh_log COMMAND ${CMAKE_COMMAND} -E rm -f ${LOG_DIR}/rec.db ${LOG_DIR}/rec.db-wal ${LOG_DIR}/rec.db-shm)
  set_tests_properties(cli.record_fresh_log PROPERTIES FIXTURES_SETUP cli_rec_log)
  zcorr_cli_test(NAME record_samples ARGS record --db ${LOG_DIR}/rec.db --config ${CLI_DATA}/point.conf --samples
                 ${CLI_DATA}/samples.csv --analyses ${CLI_DATA}/analyses.csv EXPECT_EXIT 1 MATCH "bad rows           1")
  zcorr_cli_test(NAME record_rerun_resumes ARGS record --db ${LOG_DIR}/rec.db --config ${CLI_DATA}/point.conf
                 --samples ${CLI_DATA}/samples.csv MATCH "rows read          180 \\(180 already recorded")
  set_tests_properties(cli.record_samples PROPERTIES FIXTURES_REQUIRED cli_rec_log)
  set_tests_properties(cli.record_rerun_resumes PROPERTIES DEPENDS cli.record_samples)
  zcorr_cli_test(NAME record_then_verify ARGS verify --db ${LOG_DIR}/rec.db MATCH "result    clean")
  set_tests_properties(cli.record_then_verify PROPERTIES DEPENDS cli.record_rerun_resumes)
else()
  zcorr_cli_test(NAME record_method_missing ARGS record --db ${LOG_DIR}/x.db --config ${CLI_DATA}/point.conf --samples
                 ${CLI_DATA}/samples.csv EXPECT_EXIT 2 MATCH "not available in this build")
endif()

# The demo: a week of 1-minute data recorded to a log that verifies clean.
if(EXISTS ${PROJECT_SOURCE_DIR}/engine/eval/gerg2008_adapter.cpp)
  zcorr_cli_test(NAME demo_week ARGS demo --dir ${LOG_DIR}/demo MATCH "2026-03-08 .*verify: clean")
  zcorr_cli_test(NAME demo_week_log_verifies ARGS verify --db ${LOG_DIR}/demo/hollin-ford.db MATCH "10080 intervals.*result    clean")
  set_tests_properties(cli.demo_week_log_verifies PROPERTIES DEPENDS cli.demo_week)
endif()

# SIGKILL during `zcorr record`, verify, resume; the result equals an uninterrupted recording.
if(EXISTS ${PROJECT_SOURCE_DIR}/engine/eval/gerg2008_adapter.cpp)
  add_test(NAME cli.record_killed_and_resumed
           COMMAND bash ${CMAKE_CURRENT_SOURCE_DIR}/cli/kill_record.sh $<TARGET_FILE:zcorr> ${LOG_DIR}/kill ${CLI_DATA}/point.conf
                   ${CLI_DATA}/analyses.csv)
  set_tests_properties(cli.record_killed_and_resumed PROPERTIES PASS_REGULAR_EXPRESSION "final log equals the uninterrupted one")
endif()

# An anchored head, two recorders through a hard link, a closed log on read-only media (tests/cli/log_safety.sh).
if(EXISTS ${PROJECT_SOURCE_DIR}/engine/eval/gerg2008_adapter.cpp)
  add_test(NAME cli.log_safety
           COMMAND bash ${CMAKE_CURRENT_SOURCE_DIR}/cli/log_safety.sh $<TARGET_FILE:zcorr> ${LOG_DIR}/safety ${CLI_DATA}/point.conf
                   ${CLI_DATA}/analyses.csv)
  set_tests_properties(cli.log_safety PROPERTIES PASS_REGULAR_EXPRESSION "anchor, hard link and read-only media all hold"
                       SKIP_RETURN_CODE 77)
endif()
