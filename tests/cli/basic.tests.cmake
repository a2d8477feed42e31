# Basic CLI behaviour and bad input (issue: foundation, "Bad input").
zcorr_cli_test(NAME help ARGS --help MATCH "CAUTION: custody-transfer")
zcorr_cli_test(NAME z_help ARGS z --help MATCH "Examples:")
zcorr_cli_test(NAME no_command ARGS EXPECT_EXIT 2)
zcorr_cli_test(NAME cases_summary ARGS cases MATCH "[0-9]+ passed, 0 failed")
zcorr_cli_test(NAME cases_bad_dir ARGS cases --dir /nonexistent EXPECT_EXIT 2 MATCH "not a folder")
