# zcorr audit --report FILE.html: the report beside the normal output, a
# refused path, and the report in a real browser (headless Chromium; see
# report_chromium.sh). Chromium is looked for at configure time: without it
# the browser test reports itself skipped, unless ZCORR_REQUIRE_BROWSER is ON
# (scripts/test.sh, and so CI), which makes a missing browser a configure error.
set(REPORT_DIR ${CMAKE_CURRENT_BINARY_DIR}/cli_report)
set(REPORT_LOGS ${CMAKE_CURRENT_BINARY_DIR}/cli_logs)
file(MAKE_DIRECTORY ${REPORT_DIR})

# The normal output is unchanged on standard output; the report is written as well.
zcorr_cli_test(NAME audit_report_csv ARGS audit --db ${REPORT_LOGS}/tampered.db --format csv --report ${REPORT_DIR}/tampered.html
               EXPECT_EXIT 1 MATCH "^kind,severity,point,from,to,.*broken_chain,critical,TEST-1,.*report written to .*tampered.html")
zcorr_cli_test(NAME audit_report_unwritable ARGS audit --db ${REPORT_LOGS}/tampered.db --report ${REPORT_DIR}/no-such-folder/r.html
               EXPECT_EXIT 2 MATCH "zcorr audit: --report: '.*no-such-folder/r.html' is not accepted; a file that can be written")
zcorr_cli_test(NAME audit_report_folder ARGS audit --db ${REPORT_LOGS}/tampered.db --report ${REPORT_DIR} EXPECT_EXIT 2
               MATCH "--report: .* a file, not a folder")
# Never the log itself, nor another SQLite file: the report would destroy it.
zcorr_cli_test(NAME audit_report_onto_the_log ARGS audit --db ${REPORT_LOGS}/tampered.db --report ${REPORT_LOGS}/tampered.db EXPECT_EXIT 2
               MATCH "--report: .* a file other than the log given with --db")
zcorr_cli_test(NAME audit_report_onto_another_log ARGS audit --db ${REPORT_LOGS}/tampered.db --report ${REPORT_LOGS}/clean.db EXPECT_EXIT 2
               MATCH "--report: .* not an SQLite database")
zcorr_cli_test(NAME audit_report_log_still_verifies ARGS verify --db ${REPORT_LOGS}/clean.db MATCH "clean")
set_tests_properties(cli.audit_report_onto_the_log cli.audit_report_onto_another_log cli.audit_report_log_still_verifies
                     PROPERTIES FIXTURES_REQUIRED cli_logs)
set_tests_properties(cli.audit_report_log_still_verifies PROPERTIES DEPENDS "cli.audit_report_onto_the_log;cli.audit_report_onto_another_log")
# An unreadable log exits 2 and leaves no report file behind.
add_test(NAME cli.audit_report_unreadable_log
         COMMAND sh -c "rm -f unreadable.html; $<TARGET_FILE:zcorr> audit --db ${REPORT_LOGS}/garbage.db --report unreadable.html; rc=$?; test $rc -eq 2 && test ! -e unreadable.html && echo 'exit 2, no report'"
         WORKING_DIRECTORY ${REPORT_DIR})
set_tests_properties(cli.audit_report_unreadable_log PROPERTIES PASS_REGULAR_EXPRESSION "exit 2, no report")
set_tests_properties(cli.audit_report_csv cli.audit_report_unwritable cli.audit_report_folder cli.audit_report_unreadable_log
                     PROPERTIES FIXTURES_REQUIRED cli_logs)

find_program(ZCORR_CHROMIUM NAMES chromium chromium-browser DOC "Chromium, for the browser test of the audit report")
if(NOT ZCORR_CHROMIUM AND ZCORR_REQUIRE_BROWSER)
  message(FATAL_ERROR "ZCORR_REQUIRE_BROWSER is ON but no chromium was found: install Debian's chromium package "
                      "(scripts/install-deps.sh does), or set ZCORR_CHROMIUM to the browser")
endif()
if(EXISTS ${PROJECT_SOURCE_DIR}/engine/eval/gerg2008_adapter.cpp)
  if(ZCORR_CHROMIUM)
    add_test(NAME cli.audit_report_chromium
             COMMAND bash ${CMAKE_CURRENT_SOURCE_DIR}/cli/report_chromium.sh $<TARGET_FILE:zcorr> ${ZCORR_CHROMIUM}
                     ${REPORT_DIR}/browser ${REPORT_LOGS}/demo/hollin-ford.db ${REPORT_LOGS}/tampered.db)
    set_tests_properties(cli.audit_report_chromium PROPERTIES PASS_REGULAR_EXPRESSION "report in a browser: all checks passed"
                         TIMEOUT 180)
  else()
    add_test(NAME cli.audit_report_chromium
             COMMAND sh -c "echo 'skipped: no chromium found at configure time (apt-get install chromium; -DZCORR_REQUIRE_BROWSER=ON makes this an error)'; exit 77")
    set_tests_properties(cli.audit_report_chromium PROPERTIES SKIP_RETURN_CODE 77)
  endif()
  set_tests_properties(cli.audit_report_chromium PROPERTIES DEPENDS cli.demo_week FIXTURES_REQUIRED cli_logs)
  # A what-if the audit refuses (exit 2) leaves no report file behind either.
  add_test(NAME cli.audit_report_refused_what_if
           COMMAND sh -c "rm -f refused.html; $<TARGET_FILE:zcorr> audit --db ${REPORT_LOGS}/demo/hollin-ford.db --what-if-analysis 3 --report refused.html; rc=$?; test $rc -eq 2 && test ! -e refused.html && echo 'exit 2, no report'"
           WORKING_DIRECTORY ${REPORT_DIR})
  set_tests_properties(cli.audit_report_refused_what_if PROPERTIES PASS_REGULAR_EXPRESSION "exit 2, no report" DEPENDS cli.demo_week)
endif()
