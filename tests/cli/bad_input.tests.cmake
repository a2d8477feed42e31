# Bad input (foundation issue, "Bad input"): a one-line error naming the field
# and value with exit 2, or in a batch the row kept with an empty Z, a status
# saying why, and exit 1. Never a crash, a hang or a silent number.
set(GOOD_GAS "methane=0.95,ethane=0.03,nitrogen=0.02")
zcorr_cli_test(NAME bad.sum_0.9 ARGS z --method gerg2008 --T "15 degC" --p "5 MPa" --gas "methane=0.9"
               EXPECT_EXIT 2 MATCH "sum: '0.9'")
zcorr_cli_test(NAME bad.negative_fraction ARGS z --method gerg2008 --T "15 degC" --p "5 MPa" --gas "methane=1.05,ethane=-0.05"
               EXPECT_EXIT 2 MATCH "ethane: '-0.05'.*>= 0")
zcorr_cli_test(NAME bad.negative_pressure ARGS z --method gerg2008 --T "15 degC" --p "-5 kPa" --gas ${GOOD_GAS}
               EXPECT_EXIT 2 MATCH "--p: '-5 kPa'.*>= 0")
zcorr_cli_test(NAME bad.T_abc ARGS z --method gerg2008 --T abc --p "5 MPa" --gas ${GOOD_GAS}
               EXPECT_EXIT 2 MATCH "--T: 'abc'")
zcorr_cli_test(NAME bad.T_nan ARGS z --method gerg2008 --T "nan K" --p "5 MPa" --gas ${GOOD_GAS}
               EXPECT_EXIT 2 MATCH "--T: 'nan K'.*finite")
zcorr_cli_test(NAME bad.p_inf ARGS z --method gerg2008 --T "300 K" --p "inf kPa" --gas ${GOOD_GAS}
               EXPECT_EXIT 2 MATCH "--p: 'inf kPa'.*finite")
zcorr_cli_test(NAME bad.unknown_component ARGS z --method gerg2008 --T "15 degC" --p "5 MPa" --gas "methane=0.95,xenon=0.05"
               EXPECT_EXIT 2 MATCH "'xenon'.*unknown component")
zcorr_cli_test(NAME bad.psi_ambiguous ARGS z --method gerg2008 --T "60 degF" --p "725 psi" --gas ${GOOD_GAS}
               EXPECT_EXIT 2 MATCH "ambiguous")
zcorr_cli_test(NAME bad.unknown_method ARGS z --method nosuch --T "15 degC" --p "5 MPa" --gas ${GOOD_GAS}
               EXPECT_EXIT 2 MATCH "--method: 'nosuch'")
zcorr_cli_test(NAME bad.empty_file ARGS z --method gerg2008 --input ${CLI_DATA}/empty.csv
               EXPECT_EXIT 2 MATCH "empty")
zcorr_cli_test(NAME bad.missing_file ARGS z --method gerg2008 --input ${CLI_DATA}/no_such_file.csv
               EXPECT_EXIT 2 MATCH "cannot be opened")
zcorr_cli_test(NAME bad.header ARGS z --method gerg2008 --input ${CLI_DATA}/batch_bad_header.csv
               EXPECT_EXIT 2 MATCH "T_K and P_kPa")
# Rows keep their place: good rows computed, bad rows with empty Z and a reason, exit 1.
zcorr_cli_test(NAME bad.batch_rows ARGS z --method gerg2008 --input ${CLI_DATA}/batch_bad_rows.csv EXPECT_EXIT 1
               MATCH "good,0\\.[0-9]+,[0-9.]+,ok\n288.15,-5,0.95,0.03,0.02,negative_p,,,[^\n]*P_kPa[^\n]*\nabc,5000,0.95,0.03,0.02,bad_T,,,[^\n]*T_K[^\n]*\n288.15,5000,0.9,0,0,sum_0.9,,,[^\n]*sum[^\n]*\n288.15,5000,0.97,0.05,-0.02,negative_x,,,[^\n]*nitrogen[^\n]*\nnan,5000,0.95,0.03,0.02,nan_T,,,[^\n]*\n288.15,inf,0.95,0.03,0.02,inf_p,,,[^\n]*\n300,2000,0.95,0.03,0.02,good2,0\\.[0-9]+")
# An unknown column passes through untouched (design contract: other columns pass through).
zcorr_cli_test(NAME batch.passthrough ARGS z --method gerg2008 --input ${CLI_DATA}/batch_unknown_column.csv EXPECT_EXIT 1
               MATCH "T_K,P_kPa,methane,xenon,Z,rho_mol_per_L,status")
