# The engine revision: `zcorr --version` states the version and the source
# revision on its first line (DEVELOPERS.md interface contract 7); the audit
# names the engine versions that wrote a log, and says so when they are not
# the one replaying it. The old log is zcorr 0.1.0's own (tests/data/logs).
zcorr_cli_test(NAME version ARGS --version
               MATCH "^zcorr [0-9]+\\.[0-9]+\\.[0-9]+ \\(revision [A-Za-z0-9._+-]+\\)\ninterval log: schema version [0-9]+, .*CAUTION")

if(EXISTS ${PROJECT_SOURCE_DIR}/engine/eval/gerg2008_adapter.cpp)
  set(REV_DIR ${CMAKE_CURRENT_BINARY_DIR}/cli_revision)
  file(MAKE_DIRECTORY ${REV_DIR})
  add_test(NAME cli.revision_setup
           COMMAND ${CMAKE_COMMAND} -E chdir ${REV_DIR} sh -c
                   "rm -f old.db old.db-wal old.db-shm old.db-writer.lock && cp ${PROJECT_SOURCE_DIR}/tests/data/logs/zcorr-0.1.0-schema3.db old.db")
  set_tests_properties(cli.revision_setup PROPERTIES FIXTURES_SETUP cli_revision_old)

  # Read as it is (schema 3): verifies, audits clean, and says who wrote it.
  zcorr_cli_test(NAME revision_old_verify ARGS verify --db ${REV_DIR}/old.db
                 MATCH "schema 3, .*
encoding  zcorr\.record\.v1 131; log created by zcorr 0\.1\.0 \(revision unknown\)
.*result    clean")
  zcorr_cli_test(NAME revision_old_audit ARGS audit --db ${REV_DIR}/old.db
                 MATCH "\nwritten by zcorr 0\\.1\\.0 \\(revision unknown\\): 120 interval\\(s\\)\nreplayed   by zcorr [0-9.]+ \\(revision [^)]+\\), another engine version or revision than wrote the log.*nothing found")
  zcorr_cli_test(NAME revision_old_audit_json ARGS audit --db ${REV_DIR}/old.db --format json
                 MATCH "\"written_by\": \\[\n +{\n +\"engine_version\": \"zcorr 0\\.1\\.0 \\(revision unknown\\)\",\n +\"intervals\": 120\n +}\n +\\],\n +\"written_by_another_engine\": true")
  set_tests_properties(cli.revision_old_verify cli.revision_old_audit cli.revision_old_audit_json PROPERTIES FIXTURES_REQUIRED cli_revision_old)
  # Reading did not upgrade it; recording onto it does, and the mixed log verifies.
  add_test(NAME cli.revision_old_still_schema_3 COMMAND sh -c "test \"$(sqlite3 ${REV_DIR}/old.db 'SELECT max(version) FROM schema_version')\" = 3")
  set_tests_properties(cli.revision_old_still_schema_3 PROPERTIES FIXTURES_REQUIRED cli_revision_old
                       DEPENDS "cli.revision_old_verify;cli.revision_old_audit;cli.revision_old_audit_json")
  add_test(NAME cli.revision_next_hour_samples
           COMMAND sh -c "awk 'BEGIN { print \"time,p_kPa,T_degC,V_m3\"; for (i = 1; i <= 360; i++) printf \"%d,%.3f,%.3f,%.5f\\n\", 1772434800 + 10 * i, 5000 + 300 * sin(i / 50), 12, 0.2 }' > ${REV_DIR}/next.csv")
  set_tests_properties(cli.revision_next_hour_samples PROPERTIES FIXTURES_SETUP cli_revision_next)
  zcorr_cli_test(NAME revision_record_onto_old ARGS record --db ${REV_DIR}/old.db --config ${CLI_DATA}/point.conf --samples ${REV_DIR}/next.csv
                 MATCH "intervals          60 ")
  set_tests_properties(cli.revision_record_onto_old PROPERTIES FIXTURES_REQUIRED "cli_revision_old;cli_revision_next"
                       DEPENDS cli.revision_old_still_schema_3)
  zcorr_cli_test(NAME revision_mixed_verify ARGS verify --db ${REV_DIR}/old.db
                 MATCH "schema [0-9]+, .*
encoding  zcorr\.record\.v1 131, zcorr\.record\.v[0-9]+ [0-9]+; log created by zcorr 0\.1\.0 \(revision unknown\)
.*result    clean")
  zcorr_cli_test(NAME revision_mixed_audit ARGS audit --db ${REV_DIR}/old.db
                 MATCH "\nwritten by zcorr 0\\.1\\.0 \\(revision unknown\\): 120 interval\\(s\\); zcorr [0-9.]+ \\(revision [^)]+\\): 60 interval\\(s\\)\nreplayed   by .*another engine version.*nothing found")
  set_tests_properties(cli.revision_mixed_verify cli.revision_mixed_audit PROPERTIES FIXTURES_REQUIRED cli_revision_old
                       DEPENDS cli.revision_record_onto_old)

  # A log this build wrote: its own version, no note.
  zcorr_cli_test(NAME revision_demo_audit ARGS audit --db ${CMAKE_CURRENT_BINARY_DIR}/cli_logs/demo/hollin-ford.db
                 MATCH "\nwritten by zcorr [0-9.]+ \\(revision [^)]+\\): 10080 interval\\(s\\)\nreplayed   by zcorr [0-9.]+ \\(revision [^)]+\\)\nintervals")
  zcorr_cli_test(NAME revision_demo_audit_json ARGS audit --db ${CMAKE_CURRENT_BINARY_DIR}/cli_logs/demo/hollin-ford.db --format json
                 MATCH "\"written_by_another_engine\": false")
  set_tests_properties(cli.revision_demo_audit cli.revision_demo_audit_json PROPERTIES DEPENDS cli.demo_week)
endif()
