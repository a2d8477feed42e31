# zcorr z --method gerg2008: the batch CSV contract (DEVELOPERS.md, interface contract 1)
# and the derived properties. Expected Z values: GERG-2008 reference states, teqp strict
# model, shared data set gerg2008-reference (tests/data/gerg2008/states.csv):
# PURE-N2_T300_P5000 Z = 0.996608688010853, PURE-CH4_T300_P1000 Z = 0.98322609393805.

# Every input column unchanged and in order, then Z, rho_mol_per_L, status.
zcorr_cli_test(NAME gerg2008_batch_header ARGS z --method gerg2008 --input ${CLI_DATA}/gerg2008_ok.csv
               MATCH "^T_K,P_kPa,nitrogen,methane,Z,rho_mol_per_L,status\n")
zcorr_cli_test(NAME gerg2008_batch_values ARGS z --method gerg2008 --input ${CLI_DATA}/gerg2008_ok.csv
               MATCH "300,5000,1,0,0\\.99660868801[0-9]*,2\\.0113581317[0-9]*,ok\n300,1000,0,1,0\\.98322609393[0-9]*,0\\.4077469060[0-9]*,ok")
# Standard input works the same.
zcorr_cli_test(NAME gerg2008_batch_stdin ARGS z --method gerg2008 --input - STDIN ${CLI_DATA}/gerg2008_ok.csv
               MATCH "300,1000,0,1,0\\.98322609393")
# Rows that cannot be computed keep their place with an empty Z; other columns pass
# through; a missing component value is zero; exit 1 when some row is not computed.
zcorr_cli_test(NAME gerg2008_batch_partial ARGS z --method gerg2008 --input ${CLI_DATA}/gerg2008_batch.csv EXPECT_EXIT 1
               MATCH "id,T_K,P_kPa,methane,nitrogen,note,Z,rho_mol_per_L,status\nn2,300,5000,0,1,pure nitrogen,0\\.99660868801[0-9]*,[0-9.]+,ok\nch4,300,1000,1,,pure methane,0\\.98322609393[0-9]*,[0-9.]+,ok\ncold,-5,1000,1,0,bad temperature,,,invalid_temperature[^\n]*\nhot,900,1000,1,0,outside the extended range,,,out_of_range;range=outside")
# Outside the extended range on request: computed and flagged.
zcorr_cli_test(NAME gerg2008_batch_allow_outside ARGS z --method gerg2008 --allow-outside-range --input ${CLI_DATA}/gerg2008_batch.csv
               EXPECT_EXIT 1 MATCH "hot,900,1000,1,0,outside the extended range,1\\.[0-9]+,[0-9.]+,ok;range=outside;extrapolated")
# Derived properties as extra columns, after status.
zcorr_cli_test(NAME gerg2008_batch_columns ARGS z --method gerg2008 --input ${CLI_DATA}/gerg2008_ok.csv --columns w_m_per_s,kappa,B_cm3_per_mol
               MATCH "T_K,P_kPa,nitrogen,methane,Z,rho_mol_per_L,status,w_m_per_s,kappa,B_cm3_per_mol\n300,5000,1,0,[0-9.]+,[0-9.]+,ok,3[0-9][0-9]\\.[0-9]+,1\\.[0-9]+,-4\\.4838153237")
# Single state, JSON: the speed of sound of a pipeline gas is reported.
zcorr_cli_test(NAME gerg2008_json_speed_of_sound
               ARGS z --method gerg2008 --T 15degC --p 5MPa --gas methane=0.9,nitrogen=0.02,carbon_dioxide=0.015,ethane=0.045,propane=0.012,n_butane=0.002,isobutane=0.002,n_pentane=0.0008,isopentane=0.0007,n_hexane=0.0004,hydrogen=0.0015,helium=0.0006 --format json
               MATCH "\"w_m_per_s\": 39[0-9]\\.[0-9]+")
zcorr_cli_test(NAME gerg2008_single_no_gas_root ARGS z --method gerg2008 --T 150K --p 5MPa --gas methane=1 EXPECT_EXIT 1
               MATCH "no_gas_root")
