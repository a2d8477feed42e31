# zcorr correct: a correction set written to a copy of the demo's week
# (GERG-2008), then audited: clean, with the as-recorded and corrected totals
# side by side and the set listed; the contract the set fixes now holds.
# Refusals exit 2 and write nothing. The progress bar appears on a terminal
# (util-linux `script` gives the command one) and never in redirected output.
if(EXISTS ${PROJECT_SOURCE_DIR}/engine/eval/gerg2008_adapter.cpp)
  set(CORR_DIR ${CMAKE_CURRENT_BINARY_DIR}/cli_correct)
  set(CORR_DB ${CORR_DIR}/week.db)
  file(MAKE_DIRECTORY ${CORR_DIR})
  add_test(NAME cli.correct_setup
           COMMAND ${CMAKE_COMMAND} -E chdir ${CORR_DIR} sh -c
                   "rm -f week.db week.db-wal week.db-shm week.db-writer.lock && sqlite3 ${CMAKE_CURRENT_BINARY_DIR}/cli_logs/demo/hollin-ford.db '.backup week.db' && printf 'point = HF-1\\nmethod = gerg2008\\nbase_T = 15 degC\\nbase_p = 101.56 kPa\\n' > contract.txt")
  set_tests_properties(cli.correct_setup PROPERTIES DEPENDS cli.demo_week FIXTURES_SETUP cli_correct_copy)

  zcorr_cli_test(NAME correct_no_reason ARGS correct --db ${CORR_DB} --point HF-1 --base-p "101.56 kPa" --reason
                 EXPECT_EXIT 2 MATCH "--reason")
  zcorr_cli_test(NAME correct_no_change ARGS correct --db ${CORR_DB} --point HF-1 --reason "x" EXPECT_EXIT 2
                 MATCH "at least one of --method, --base-T, --base-p, --analysis")
  zcorr_cli_test(NAME correct_bad_pressure ARGS correct --db ${CORR_DB} --point HF-1 --base-p "-3 kPa" --reason "x" EXPECT_EXIT 2
                 MATCH "--base-p")
  zcorr_cli_test(NAME correct_missing_db ARGS correct --db ${CORR_DIR}/none.db --point HF-1 --base-p "101.56 kPa" --reason "x"
                 EXPECT_EXIT 2 MATCH "--db: .*an existing interval log")
  set_tests_properties(cli.correct_no_reason cli.correct_no_change cli.correct_bad_pressure cli.correct_missing_db
                       PROPERTIES FIXTURES_REQUIRED cli_correct_copy)
  # The refusals wrote nothing: the copy still has no correction set.
  add_test(NAME cli.correct_refusals_wrote_nothing
           COMMAND sh -c "test \"$(sqlite3 ${CORR_DB} 'SELECT count(*) FROM interval WHERE corrects_seq IS NOT NULL')\" = 0")
  set_tests_properties(cli.correct_refusals_wrote_nothing PROPERTIES FIXTURES_REQUIRED cli_correct_copy
                       DEPENDS "cli.correct_no_reason;cli.correct_no_change;cli.correct_bad_pressure")

  zcorr_cli_test(NAME correct_base_pressure ARGS correct --db ${CORR_DB} --point HF-1 --base-p "101.56 kPa"
                 --reason "contract base pressure is 101.56 kPa"
                 MATCH "correction set seq [0-9]+ written.*10080 interval\\(s\\) replaced.*base vol.  12772369.578410 m3 as logged, 127[0-9.]+ m3 corrected \\(-")
  set_tests_properties(cli.correct_base_pressure PROPERTIES FIXTURES_REQUIRED cli_correct_copy FIXTURES_SETUP cli_corrected
                       DEPENDS cli.correct_refusals_wrote_nothing)

  zcorr_cli_test(NAME correct_audit ARGS audit --db ${CORR_DB}
                 MATCH "intervals  10080 \\(10080 recomputed.*corrected  base volume 12772369.578410 m3 as recorded, 127[0-9.]+ m3 corrected.*correction set seq [0-9]+ HF-1 .*reason: contract base pressure.*nothing above a notice")
  zcorr_cli_test(NAME correct_audit_contract ARGS audit --db ${CORR_DB} --contract ${CORR_DIR}/contract.txt MATCH "nothing above a notice")
  zcorr_cli_test(NAME correct_audit_json ARGS audit --db ${CORR_DB} --format json MATCH "\"correction_sets\": \\[[^]]*\"change\": \"base_p 101560 Pa\"")
  zcorr_cli_test(NAME correct_verify ARGS verify --db ${CORR_DB} MATCH "clean")
  # Daily records as recorded, beside the corrected sums (the first contract day of the demo).
  zcorr_cli_test(NAME correct_quantities ARGS quantities --db ${CORR_DB} --period day --format csv
                 MATCH "V_b_m3_corrected,E_MJ_corrected,mass_kg_corrected.HF-1,day,2026-03-02,.*,1938787.938135,0,19[0-9]+\\.[0-9]+,")
  set_tests_properties(cli.correct_audit cli.correct_audit_contract cli.correct_audit_json cli.correct_verify cli.correct_quantities
                       PROPERTIES FIXTURES_REQUIRED "cli_correct_copy;cli_corrected")

  # The progress bar: drawn on a terminal, absent when standard error is a file.
  add_test(NAME cli.audit_progress_on_terminal
           COMMAND sh -c "script -qec '$<TARGET_FILE:zcorr> audit --db ${CORR_DB} --format csv' /dev/null | grep -a -q 'audit \\[' && $<TARGET_FILE:zcorr> audit --db ${CORR_DB} --format csv 2>${CORR_DIR}/progress.err >/dev/null; test ! -s ${CORR_DIR}/progress.err")
  set_tests_properties(cli.audit_progress_on_terminal PROPERTIES FIXTURES_REQUIRED "cli_correct_copy;cli_corrected")

  # SIGKILL during `zcorr correct`: the log holds no set or a whole one, never a part.
  add_test(NAME cli.correct_killed
           COMMAND bash ${CMAKE_CURRENT_SOURCE_DIR}/cli/kill_correct.sh $<TARGET_FILE:zcorr> ${CORR_DIR}/kill ${CLI_DATA}/point.conf
                   ${CLI_DATA}/analyses.csv)
  set_tests_properties(cli.correct_killed PROPERTIES PASS_REGULAR_EXPRESSION "never a part of one")
endif()
