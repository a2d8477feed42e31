# zcorr z --method detail: single state and batch (contract in DEVELOPERS.md).
# Expected Z of ISO 12213-2:2006 Annex C gas 1 at 6 MPa, 270 K: 0.84053 (five
# decimals, from memory, medium confidence; see tests/detail_test.cpp).
zcorr_cli_test(NAME detail_single
               ARGS z --method detail --T 270K --p "6 MPa"
                    --gas "methane=0.965,nitrogen=0.003,CO2=0.006,ethane=0.018,propane=0.0045,iC4=0.001,nC4=0.001,iC5=0.0005,nC5=0.0003,nC6=0.0007"
               MATCH "Z +0\\.84052[5-9].*status +ok \\(range: normal\\)")
zcorr_cli_test(NAME detail_single_json
               ARGS z --method detail --T "-3.15 degC" --p "6 MPa" --format json
                    --gas "methane=0.965,nitrogen=0.003,CO2=0.006,ethane=0.018,propane=0.0045,iC4=0.001,nC4=0.001,iC5=0.0005,nC5=0.0003,nC6=0.0007"
               MATCH "\"Z\": 0\\.84052[5-9].*\"dZdT_per_K\"")
# Every row computed: exit 0, input columns unchanged and in order, then Z, rho_mol_per_L, status.
zcorr_cli_test(NAME detail_batch_ok ARGS z --method detail --input ${CLI_DATA}/detail_batch_ok.csv
               MATCH "^tag,T_K,P_kPa,methane,nitrogen,carbon_dioxide,ethane,propane,n_butane,isobutane,n_pentane,isopentane,n_hexane,Z,rho_mol_per_L,status\ngas1,270,6000,0\\.965,0\\.003,0\\.006,0\\.018,0\\.0045,0\\.001,0\\.001,0\\.0003,0\\.0005,0\\.0007,0\\.84052[5-9][0-9]*,3\\.17[0-9]*,ok\n")
zcorr_cli_test(NAME detail_batch_stdin ARGS z --method detail --input - STDIN ${CLI_DATA}/detail_batch_ok.csv
               MATCH "gas5,270,6000,0\\.812,0\\.057,0\\.076,0\\.043,0\\.009,0\\.0015,0\\.0015,,,,0\\.8260[0-9]*,[0-9.]+,ok")
zcorr_cli_test(NAME detail_batch_columns ARGS z --method detail --input ${CLI_DATA}/detail_batch_ok.csv --columns B_cm3_per_mol,dZdP_per_kPa
               MATCH "Z,rho_mol_per_L,status,B_cm3_per_mol,dZdP_per_kPa\ngas1,[^\n]*,ok,-59\\.5[0-9]*,-2\\.5[0-9]*e-05")
# Rows that cannot be computed keep their place with an empty Z and say why; exit 1.
zcorr_cli_test(NAME detail_batch_mixed ARGS z --method detail --input ${CLI_DATA}/detail_batch_mixed.csv EXPECT_EXIT 1
               MATCH "fine,300,5000,0\\.98,0\\.02,,0\\.92[0-9]*,[0-9.]+,ok\ncold,100,5000,0\\.98,0\\.02,,,,out_of_range;range=outside\nnegative_T,-5,5000,0\\.98,0\\.02,,,,invalid_temperature\ntoo_much_CO,300,5000,0\\.93,0\\.02,0\\.05,,,out_of_range;range=outside;component=carbon_monoxide\nnot_a_number,300,abc,0\\.98,0\\.02,,,,invalid_input;[^\n]*\nlast,300,5000,0\\.98,0\\.02,,0\\.92[0-9]*,[0-9.]+,ok")
# Outside the expanded range: refused (exit 1), or computed and flagged on request.
zcorr_cli_test(NAME detail_outside_refused ARGS z --method detail --T 600K --p "5 MPa" --gas "methane=0.98,nitrogen=0.02"
               EXPECT_EXIT 1 MATCH "not computed: out_of_range;range=outside")
zcorr_cli_test(NAME detail_outside_allowed ARGS z --method detail --allow-outside-range --T 600K --p "5 MPa" --gas "methane=0.98,nitrogen=0.02"
               MATCH "Z +1\\.0[0-9]*.*status +ok;range=outside;extrapolated")
zcorr_cli_test(NAME detail_expanded_flagged ARGS z --method detail --T 300K --p "5 MPa" --gas "methane=0.99,argon=0.01"
               MATCH "status +ok;range=expanded;component=argon")
# Bad input: a status or a message, never a crash.
zcorr_cli_test(NAME detail_bad_header ARGS z --method detail --input ${CLI_DATA}/detail_batch_bad_header.csv EXPECT_EXIT 2
               MATCH "T_K and P_kPa")
zcorr_cli_test(NAME detail_unknown_component ARGS z --method detail --T 300K --p "5 MPa" --gas "methane=0.98,unobtainium=0.02"
               EXPECT_EXIT 2)
# engine/data/detail_data.hpp is exactly what scripts/gen_detail_data.py makes of
# engine/data/detail_source/*.csv (skipped where no python3 is installed).
find_program(ZCORR_PYTHON3 python3)
if(ZCORR_PYTHON3)
  add_test(NAME detail_data_header_is_generated
           COMMAND ${ZCORR_PYTHON3} ${PROJECT_SOURCE_DIR}/scripts/gen_detail_data.py --check)
endif()
# zcorr convert uses the detail method for Z_f and Z_b (ISO 12213-2 Annex C gas 1 at 6 MPa, 270 K: Z = 0.84053, from memory).
zcorr_cli_test(NAME detail_convert
               ARGS convert --method detail --V "1000 m3" --T 270K --p "6 MPa"
                    --gas "methane=0.965,nitrogen=0.003,CO2=0.006,ethane=0.018,propane=0.0045,iC4=0.001,nC4=0.001,iC5=0.0005,nC5=0.0003,nC6=0.0007"
               MATCH "Z_f +0\\.84052[5-9][0-9]* +\\(detail\\).*Z_b +0\\.99[0-9]+ +\\(detail\\).*status +ok")
