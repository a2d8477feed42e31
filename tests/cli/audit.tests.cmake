# zcorr audit: exit 0 nothing above a notice, 1 warning or critical findings, 2 the log cannot be read
# (DEVELOPERS.md interface contract 4). The demo's week (GERG-2008) audits
# clean; a copy changed through the sqlite3 shell does not; a log of the
# test-double gas cannot be recomputed by the CLI (not_replayed); corrupt and
# foreign files exit 2.
set(AUDIT_DIR ${CMAKE_CURRENT_BINARY_DIR}/cli_audit)
set(AUDIT_LOGS ${CMAKE_CURRENT_BINARY_DIR}/cli_logs)
file(MAKE_DIRECTORY ${AUDIT_DIR})
add_test(NAME cli.audit_setup
         COMMAND ${CMAKE_COMMAND} -E chdir ${AUDIT_DIR} sh -c
                 "rm -f foreign.db garbage.db && sqlite3 foreign.db 'CREATE TABLE customers (id INTEGER, name TEXT); INSERT INTO customers VALUES (1, 2);' && printf 'plain text, not a database, long enough to fill a header page of sqlite. . . . .' > garbage.db && printf '# the contract of HF-1\\npoint = HF-1\\nmethod = gerg2008\\nbase_T = 15 degC\\nbase_p = 101.56 kPa\\n' > contract.txt")
set_tests_properties(cli.audit_setup PROPERTIES FIXTURES_SETUP cli_audit)

zcorr_cli_test(NAME audit_help ARGS audit --help MATCH "Exit status: 0 nothing above a notice, 1 warning or critical findings, 2 the log cannot be read")
zcorr_cli_test(NAME audit_missing ARGS audit --db ${AUDIT_DIR}/missing.db EXPECT_EXIT 2 MATCH "no such log file")
zcorr_cli_test(NAME audit_garbage ARGS audit --db ${AUDIT_DIR}/garbage.db EXPECT_EXIT 2 MATCH "zcorr audit: .*not a database")
zcorr_cli_test(NAME audit_foreign ARGS audit --db ${AUDIT_DIR}/foreign.db EXPECT_EXIT 2 MATCH "zcorr audit: .*not a zcorr log")
zcorr_cli_test(NAME audit_bad_contract ARGS audit --db ${AUDIT_DIR}/foreign.db --contract ${AUDIT_DIR}/none.txt EXPECT_EXIT 2
               MATCH "--contract")
set_tests_properties(cli.audit_missing cli.audit_garbage cli.audit_foreign cli.audit_bad_contract PROPERTIES FIXTURES_REQUIRED cli_audit)

# The test-double gas log (written by make_test_log in record.tests.cmake): its method is not in this build.
zcorr_cli_test(NAME audit_test_gas_not_replayed ARGS audit --db ${AUDIT_LOGS}/clean.db EXPECT_EXIT 1
               MATCH "not_replayed \\[warning\\] TEST-1 2026-03-02T06:00:00Z .. 2026-03-03T08:00:00Z, 1560 interval")
zcorr_cli_test(NAME audit_tampered_csv ARGS audit --db ${AUDIT_LOGS}/tampered.db --format csv EXPECT_EXIT 1
               MATCH "kind,severity,point,from,to,.*broken_chain,critical,TEST-1,2026-03-02T14:20:00Z,2026-03-02T14:21:00Z,1,515,515,")
set_tests_properties(cli.audit_test_gas_not_replayed cli.audit_tampered_csv PROPERTIES FIXTURES_REQUIRED cli_logs)

if(EXISTS ${PROJECT_SOURCE_DIR}/engine/eval/gerg2008_adapter.cpp)
  set(DEMO_DB ${AUDIT_LOGS}/demo/hollin-ford.db)
  # The week's pressure spike is listed as a notice (the converted register stopped as configured) with its
  # fault volume; the exit status stays 0.
  zcorr_cli_test(NAME audit_demo_clean ARGS audit --db ${DEMO_DB}
                 MATCH "10080 recomputed.*0 interval\\(s\\) miss the 50 ppm.*1 finding\\(s\\) \\(1 notice, nothing above a notice\\).*alarm \\[notice\\] HF-1 2026-03-04T13:07:00Z .. 2026-03-04T13:10:00Z, 3 interval.*180 s in alarm, fault volume 71.334700 m3.*CAUTION")
  zcorr_cli_test(NAME audit_demo_alarm_json ARGS audit --db ${DEMO_DB} --format json
                 MATCH "\"counting_findings\": 0,.*\"V_b_m3_difference\": 3[0-9][0-9][0-9]\\.[0-9]+.*\"V_fault_m3\": 71.3347[0-9]*.*\"kind\": \"alarm\"")
  zcorr_cli_test(NAME audit_demo_json ARGS audit --db ${DEMO_DB} --format json MATCH "\"over_bar\": 0")
  zcorr_cli_test(NAME audit_demo_range ARGS audit --db ${DEMO_DB} --point HF-1 --from 2026-03-03T00:00:00Z --to 2026-03-03T01:00:00Z
                 MATCH "intervals  60 \\(60 recomputed")
  zcorr_cli_test(NAME audit_demo_contract ARGS audit --db ${DEMO_DB} --contract ${AUDIT_DIR}/contract.txt EXPECT_EXIT 1
                 MATCH "contract_mismatch \\[critical\\] HF-1 2026-03-02T05:00:00Z .. 2026-03-05T11:00:00Z, 4680 interval.*base_p 101325 Pa \\(contract 101560 Pa\\)")
  # The dew margin: the demo's line states lie some 40 K above the dew temperature of its gas
  # (about 240 K at 4.1 MPa by zcorr dewpoint); with the widest margin (50 K) the audit lists them
  # as near_dew_point (a warning: exit 1) with their volume; beyond 50 K is refused.
  zcorr_cli_test(NAME audit_demo_dew_margin ARGS audit --db ${DEMO_DB} --dew-margin "50 K" --format json EXPECT_EXIT 1
                 MATCH "\"dew_margin_K\": 50(\\.0)?,[^\n]*\n[^\n]*\"dew_margin_source\": \"option\".*\"V_b_m3_affected\": [1-9][0-9]+\\.[0-9]+,[^{}]*\"kind\": \"near_dew_point\"")
  zcorr_cli_test(NAME audit_demo_dew_margin_bad ARGS audit --db ${DEMO_DB} --dew-margin 60 EXPECT_EXIT 2
                 MATCH "--dew-margin[^\n]*60[^\n]*0 K to 50 K")
  set_tests_properties(cli.audit_demo_clean cli.audit_demo_alarm_json cli.audit_demo_json cli.audit_demo_range cli.audit_demo_contract
                       cli.audit_demo_dew_margin cli.audit_demo_dew_margin_bad
                       PROPERTIES DEPENDS cli.demo_week)
  set_tests_properties(cli.audit_demo_contract PROPERTIES FIXTURES_REQUIRED cli_audit)
endif()

# What-if: the demo's week at another base condition, totals side by side (the audit itself stays clean).
if(EXISTS ${PROJECT_SOURCE_DIR}/engine/eval/gerg2008_adapter.cpp)
  zcorr_cli_test(NAME audit_demo_what_if ARGS audit --db ${DEMO_DB} --what-if-base-T "60 degF" --what-if-base-p "14.73 psia"
                 MATCH "what-if    10080 of 10080 intervals recomputed: base volume 12772369.578410 m3 logged, 12767[0-9.]+ m3 what-if.*combustion reference 15.55 degC \\(60 degF\\) for analyses without a stated Hs.*by cause: base conditions \\(combustion reference held\\).*by cause: combustion reference: V_b 0.000000 m3, energy -.*nothing above a notice")
  # Held: the combustion reference stays 15 degC, and the energy moves only by the base-condition step.
  zcorr_cli_test(NAME audit_demo_what_if_hold ARGS audit --db ${DEMO_DB} --what-if-base-T "60 degF" --what-if-combustion-ref hold
                 MATCH "combustion reference 15 degC for every Hs \\(held as recorded\\)")
  zcorr_cli_test(NAME audit_demo_what_if_tiny_base_p ARGS audit --db ${DEMO_DB} --what-if-base-p "1.01325e-300 bara" EXPECT_EXIT 2
                 MATCH "what-if base pressure.*an absolute base pressure from 10 kPa to 1 MPa")
  set_tests_properties(cli.audit_demo_what_if_tiny_base_p PROPERTIES DEPENDS cli.demo_week)
  zcorr_cli_test(NAME audit_demo_what_if_bad_combustion ARGS audit --db ${DEMO_DB} --what-if-combustion-ref 17 EXPECT_EXIT 2
                 MATCH "--what-if-combustion-ref.*0, 15, 15.55 \\(60 degF\\), 20 and 25 degC")
  zcorr_cli_test(NAME audit_demo_what_if_bad_analysis ARGS audit --db ${DEMO_DB} --what-if-analysis 3 EXPECT_EXIT 2
                 MATCH "the seq of a gas_analysis record")
  zcorr_cli_test(NAME audit_demo_what_if_bad_method ARGS audit --db ${DEMO_DB} --what-if-method no_such_method EXPECT_EXIT 2
                 MATCH "what-if method: 'no_such_method' is not accepted; a line method of this build")
  set_tests_properties(cli.audit_demo_what_if cli.audit_demo_what_if_hold cli.audit_demo_what_if_bad_combustion
                       cli.audit_demo_what_if_bad_analysis cli.audit_demo_what_if_bad_method
                       PROPERTIES DEPENDS cli.demo_week)
endif()
