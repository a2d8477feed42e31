# zcorr convert and zcorr demo.
# A given Z_f and Z_b: the factors are the defining ratios (worked by hand:
# 614.4/14.73 = 41.71079, 519.67/511.67 = 1.015635, 0.9976/0.9132 = 1.092422).
zcorr_cli_test(NAME convert.given_z ARGS convert --zf 0.9132 --zb 0.9976 --V "45 Mcf" --T "52 degF" --p "600 psig"
               --atm "14.4 psia" --base us60f_14.73 MATCH "Z_f +0\\.9132 +\\(given\\).*Fp +41\\.71079.*Ft +1\\.01563.*Fz +1\\.09242")
zcorr_cli_test(NAME convert.gerg2008 ARGS convert --method gerg2008 --gas "methane=0.95,ethane=0.03,nitrogen=0.02"
               --V "1250 m3" --T "8 degC" --p "4.2 MPa" --base iso15 MATCH "Z_f +0\\.9[0-9]+ +\\(gerg2008\\).*energy.*MJ \\(gross\\).*Hs data")
zcorr_cli_test(NAME convert.json ARGS convert --method gerg2008 --gas "methane=0.95,ethane=0.03,nitrogen=0.02"
               --V "1250 m3" --T "8 degC" --p "4.2 MPa" --base normal0 --format json MATCH "\"C\": 4[0-9.]+")
zcorr_cli_test(NAME convert.needs_gas ARGS convert --method gerg2008 --V "1250 m3" --T "8 degC" --p "4.2 MPa"
               EXPECT_EXIT 2 MATCH "needs the gas analysis")
zcorr_cli_test(NAME convert.bad_base ARGS convert --zf 0.9 --zb 0.998 --V "1 m3" --T "8 degC" --p "4.2 MPa" --base moon
               EXPECT_EXIT 2 MATCH "--base: 'moon'")
zcorr_cli_test(NAME convert.negative_volume ARGS convert --zf 0.9 --zb 0.998 --V "-1 m3" --T "8 degC" --p "4.2 MPa"
               EXPECT_EXIT 2 MATCH ">= 0")
zcorr_cli_test(NAME demo ARGS demo --hourly-day MATCH "Hollin Ford.*day total +V_f [0-9.]+ m3 +V_b [0-9.]+ m3.*energy [0-9.]+ GJ.*CAUTION")
