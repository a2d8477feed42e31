# zcorr z with the gross-characterization methods (SGERG-88, AGA8 gross 1 and 2):
# gross inputs as options and batch columns, an analysis reduced through
# ISO 6976, refusal of hydrogen (coefficients_missing), ranges and bad input.
set(SG_STATE --T "5 degC" --p "6 MPa")
zcorr_cli_test(NAME sgerg88.single_gross ARGS z --method sgerg88 ${SG_STATE} --Hs "40.66 MJ/m3" --d 0.581 --x-co2 0.006
               MATCH "Hs_MJ_per_m3 = 40.66 d = 0.581 x_CO2 = 0.006.*25 degC combustion, 0 degC.*B_cm3_per_mol.*C_cm6_per_mol2.*Z_virial2.*status   ok")
zcorr_cli_test(NAME sgerg88.single_bare_number_is_MJ_per_m3 ARGS z --method sgerg88 ${SG_STATE} --Hs 40.66 --d 0.581 --x-co2 0.006
               MATCH "Hs_MJ_per_m3 = 40.66 ")
zcorr_cli_test(NAME sgerg88.single_composition_json ARGS z --method sgerg88 ${SG_STATE} --format json
               --gas "methane=0.965,nitrogen=0.003,carbon_dioxide=0.006,ethane=0.018,propane=0.0045,isobutane=0.001,n_butane=0.001,isopentane=0.0005,n_pentane=0.0003,n_hexane=0.0007"
               MATCH "\"gross_reduction\": \"gross inputs from the analysis by ISO 6976:2016: Hs at 25 degC combustion")
zcorr_cli_test(NAME sgerg88.hydrogen_refused ARGS z --method sgerg88 ${SG_STATE} --Hs 34.16 --d 0.599 --x-co2 0.016 --x-h2 0.095
               EXPECT_EXIT 1 MATCH "not computed: coefficients_missing")
zcorr_cli_test(NAME sgerg88.hydrogen_refused_composition ARGS z --method sgerg88 ${SG_STATE}
               --gas "methane=0.90,nitrogen=0.03,ethane=0.05,hydrogen=0.02"
               EXPECT_EXIT 1 MATCH "coefficients_missing;component=hydrogen")
zcorr_cli_test(NAME sgerg88.outside_range_refused ARGS z --method sgerg88 --T "250 K" --p "5 MPa" --Hs 40.66 --d 0.581 --x-co2 0.006
               EXPECT_EXIT 1 MATCH "out_of_range")
zcorr_cli_test(NAME sgerg88.outside_range_allowed ARGS z --method sgerg88 --T "250 K" --p "5 MPa" --Hs 40.66 --d 0.581 --x-co2 0.006
               --allow-outside-range MATCH "ok;range=outside;extrapolated")
zcorr_cli_test(NAME gross1.single_btu ARGS z --method gross1 --T "60 degF" --p "800 psia" --Hs "1036 Btu/ft3" --d 0.6 --x-co2 0.01
               MATCH "HV_MJ_per_m3 = 38.6.*60 degF combustion.*status   ok;doubtful_data")
zcorr_cli_test(NAME gross2.single ARGS z --method gross2 --T "60 degF" --p "800 psia" --d 0.6 --x-n2 0.02 --x-co2 0.01
               MATCH "d = 0.6 x_CO2 = 0.01 x_H2 = 0 x_N2 = 0.02.*status   ok")
zcorr_cli_test(NAME gross2.above_1200_psia ARGS z --method gross2 --T "60 degF" --p "1300 psia" --d 0.6 --x-n2 0.02 --x-co2 0.01
               EXPECT_EXIT 1 MATCH "out_of_range")
# Bad gross input: a one-line error naming the field, exit 2.
zcorr_cli_test(NAME gross.bad.method_not_gross ARGS z --method gerg2008 ${SG_STATE} --Hs 40.66 --d 0.581 --x-co2 0.006
               EXPECT_EXIT 2 MATCH "need sgerg88, gross1 or gross2")
zcorr_cli_test(NAME gross.bad.gross2_needs_n2 ARGS z --method gross2 ${SG_STATE} --d 0.6 --x-co2 0.01
               EXPECT_EXIT 2 MATCH "gross2 needs x_N2")
zcorr_cli_test(NAME gross.bad.sgerg88_no_n2 ARGS z --method sgerg88 ${SG_STATE} --Hs 40 --d 0.6 --x-co2 0.01 --x-n2 0.02
               EXPECT_EXIT 2 MATCH "sgerg88 does not take x_N2")
zcorr_cli_test(NAME gross.bad.hs_unit ARGS z --method sgerg88 ${SG_STATE} --Hs "40 MJ" --d 0.6 --x-co2 0.01
               EXPECT_EXIT 2 MATCH "--Hs: '40 MJ'.*heating value per volume")
zcorr_cli_test(NAME gross.bad.fraction ARGS z --method sgerg88 ${SG_STATE} --Hs 40 --d 0.6 --x-co2 1.5
               EXPECT_EXIT 2 MATCH "--x-co2: '1.5'")
zcorr_cli_test(NAME gross.bad.gas_and_gross ARGS z --method sgerg88 ${SG_STATE} --Hs 40 --d 0.6 --x-co2 0.01 --gas "methane=1"
               EXPECT_EXIT 2 MATCH "not both")
zcorr_cli_test(NAME gross.bad.inconsistent ARGS z --method sgerg88 ${SG_STATE} --Hs 45 --d 0.56 --x-co2 0
               EXPECT_EXIT 1 MATCH "not computed: invalid_input")
# Batch: gross columns, rows kept in place, other columns passed through.
zcorr_cli_test(NAME sgerg88.batch_gross ARGS z --method sgerg88 --input ${CLI_DATA}/sgerg88_gross_batch.csv EXPECT_EXIT 1
               MATCH "T_K,P_kPa,Hs_MJ_per_m3,d,x_CO2,x_H2,meter,Z,rho_mol_per_L,status\n278.15,6000,40.66,0.581,0.006,0,M1,0\\.[0-9]+,[0-9.]+,ok\n300,8000,36.64,0.686,0.076,,M2,0\\.[0-9]+,[0-9.]+,ok\n290,5000,34.16,0.599,0.016,0.095,M3,,,coefficients_missing\n250,5000,40.66,0.581,0.006,0,M4,,,out_of_range")
zcorr_cli_test(NAME sgerg88.batch_gross_all_ok ARGS z --method sgerg88 --input ${CLI_DATA}/sgerg88_gross_ok.csv
               --columns B_cm3_per_mol,C_cm6_per_mol2,Z_virial2 MATCH "Z_virial2\n278.15,6000,40.66,0.581,0.006,0\\.8")
zcorr_cli_test(NAME sgerg88.batch_composition ARGS z --method sgerg88 --input ${CLI_DATA}/sgerg88_composition_batch.csv
               EXPECT_EXIT 1 MATCH ",ok;doubtful_data;gross_from=iso6976_Hs25C/0C_d0C\n.*,,,coefficients_missing;component=hydrogen")
zcorr_cli_test(NAME gross1.batch_hv ARGS z --method gross1 --input ${CLI_DATA}/gross1_hv_batch.csv MATCH ",ok;doubtful_data\n")
zcorr_cli_test(NAME gross2.batch ARGS z --method gross2 --input ${CLI_DATA}/gross2_batch.csv MATCH "0.01,0\\.[0-9]+,[0-9.]+,ok\n")
zcorr_cli_test(NAME gross.bad.batch_mixed ARGS z --method sgerg88 --input ${CLI_DATA}/gross_and_components.csv
               EXPECT_EXIT 2 MATCH "not both")
zcorr_cli_test(NAME gross.bad.batch_gross2_hv ARGS z --method gross2 --input ${CLI_DATA}/gross1_hv_batch.csv
               EXPECT_EXIT 2 MATCH "gross2 does not take a Hs_MJ_per_m3")
