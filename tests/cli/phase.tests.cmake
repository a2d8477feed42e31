# Phase safety on GERG-2008: zcorr z reports two-phase states, zcorr dewpoint gives the
# hydrocarbon dew temperature. Data: tests/cli/data/phase_states.csv holds the five states
# the shared data set gerg2008-reference leaves out as two-phase (its README, "Left out as
# two-phase": G05 at 260 K / 2000 and 5000 kPa, G15 at 260 K / 2000 kPa, G20 at 260 K /
# 2000 and 5000 kPa; compositions from tests/data/gerg2008/states.csv) and four of its
# single-phase states (G05_T273.15_P2000, G05_T288.15_P5000, G20_T273.15_P5000,
# G05_T260_P12000, rows of the same file). tests/cli/data/dewpoint_bad_rows.csv is invented.

# The two-phase states keep their place with an empty Z and status two_phase; the
# single-phase ones are ok (G05 at 273.15 K / 2000 kPa lies 1.4 K above its dew temperature,
# 271.78 K by zcorr's own dew search: near_dew_point with the default 5 K margin); exit 1
# because some rows are not computed.
zcorr_cli_test(NAME phase_z_two_phase ARGS z --method gerg2008 --input ${CLI_DATA}/phase_states.csv EXPECT_EXIT 1
               MATCH "G05_T260_P2000,260,2000,[^\n]*,,,two_phase\nG05_T260_P5000,[^\n]*,,,two_phase\nG15_T260_P2000,[^\n]*,,,two_phase\nG20_T260_P2000,[^\n]*,,,two_phase\nG20_T260_P5000,[^\n]*,,,two_phase\nG05_T273\\.15_P2000,[^\n]*,0\\.948[0-9]+,[0-9.]+,ok;near_dew_point\nG05_T288\\.15_P5000,[^\n]*,0\\.8955556872[0-9]*,[0-9.]+,ok\nG20_T273\\.15_P5000,[^\n]*,ok\nG05_T260_P12000,[^\n]*,ok\n")
# Single state: the status says two_phase and nothing is computed.
zcorr_cli_test(NAME phase_z_single_two_phase
               ARGS z --method gerg2008 --T 260K --p 2000kPa --gas methane=0.9250600,nitrogen=0.0215925,carbon_dioxide=0.0084963,ethane=0.0376191,propane=0.0024881,n_butane=0.0001445,isobutane=0.0001874,n_pentane=0.0005678,isopentane=0.0012766,n_hexane=0.0003014,n_heptane=0.0001642,n_octane=0.0000917,n_nonane=0.0000163,n_decane=0.0000065,oxygen=0.0000803,hydrogen_sulfide=0.0001765,helium=0.0017308
               EXPECT_EXIT 1 MATCH "status   two_phase")
# zcorr dewpoint batch: every input column, then T_dew_K and status. The two-phase states
# lie below their dew temperature (260 K < 260.3-271.8 K), the single-phase states above
# theirs, and at 12 MPa (above the cricondenbar of G05) there is none.
zcorr_cli_test(NAME phase_dewpoint_batch ARGS dewpoint --method gerg2008 --input ${CLI_DATA}/phase_states.csv
               MATCH "^case_id,T_K,P_kPa,methane,[^\n]*,argon,T_dew_K,status\nG05_T260_P2000,260,2000,[^\n]*,2(6[1-9]|7[0-9])\\.[0-9]+,ok\nG05_T260_P5000,[^\n]*,2(6[1-9]|7[0-9])\\.[0-9]+,ok\nG15_T260_P2000,[^\n]*,260\\.[0-9]+,ok;water_excluded\nG20_T260_P2000,[^\n]*,2(6[1-9]|7[0-9])\\.[0-9]+,ok;water_excluded\nG20_T260_P5000,[^\n]*,2(6[1-9]|7[0-9])\\.[0-9]+,ok;water_excluded\nG05_T273\\.15_P2000,[^\n]*,2(6[0-9]|7[0-2])\\.[0-9]+,ok\nG05_T288\\.15_P5000,[^\n]*,2[6-7][0-9]\\.[0-9]+,ok\nG20_T273\\.15_P5000,[^\n]*,2(6[0-9]|7[0-2])\\.[0-9]+,ok;water_excluded\nG05_T260_P12000,[^\n]*,,no_dew_point;above_cricondenbar\n")
# Rows that cannot be computed keep their place with a status that says why; exit 1.
zcorr_cli_test(NAME phase_dewpoint_bad_rows ARGS dewpoint --input ${CLI_DATA}/dewpoint_bad_rows.csv EXPECT_EXIT 1
               MATCH "ok,3000,0\\.95,0\\.04,0\\.01,,,2[0-9][0-9]\\.[0-9]+,ok\nabove_ccb,40000,[^\n]*,,no_dew_point;above_cricondenbar\nbad_p,nan,[^\n]*,,invalid_pressure;P_kPa[^\n]*\nneg_p,-5,[^\n]*,,invalid_pressure;P_kPa[^\n]*\nno_hc,3000,[^\n]*,,invalid_composition;no_hydrocarbon\n")
# Unusable input: no P_kPa column, another method.
zcorr_cli_test(NAME phase_dewpoint_no_pressure ARGS dewpoint --input ${CLI_DATA}/dewpoint_no_pressure.csv EXPECT_EXIT 2
               MATCH "P_kPa")
zcorr_cli_test(NAME phase_dewpoint_other_method ARGS dewpoint --method detail --input ${CLI_DATA}/phase_states.csv EXPECT_EXIT 2
               MATCH "gerg2008 only")
# One analysis: the dew temperature, the cricondentherm and cricondenbar, and the caution.
zcorr_cli_test(NAME phase_dewpoint_single
               ARGS dewpoint --gas methane=0.9250600,nitrogen=0.0215925,carbon_dioxide=0.0084963,ethane=0.0376191,propane=0.0024881,n_butane=0.0001445,isobutane=0.0001874,n_pentane=0.0005678,isopentane=0.0012766,n_hexane=0.0003014,n_heptane=0.0001642,n_octane=0.0000917,n_nonane=0.0000163,n_decane=0.0000065,oxygen=0.0000803,hydrogen_sulfide=0.0001765,helium=0.0017308 --p 2000kPa
               MATCH "T_dew    27[0-9]\\.[0-9]+ K[^\n]*\nstatus   ok\ncricondentherm  27[0-9]\\.[0-9]+ K at [0-9.]+ kPa\ncricondenbar    [0-9.]+ kPa at [0-9.]+ K\n[^C]*CAUTION: custody-transfer")
zcorr_cli_test(NAME phase_dewpoint_json
               ARGS dewpoint --gas methane=0.95,ethane=0.04,n_hexane=0.01 --p 3MPa --format json
               MATCH "\"T_dew_K\": 2[0-9][0-9]\\.[0-9]+[^}]*\"caution\"")
zcorr_cli_test(NAME phase_dewpoint_help ARGS dewpoint --help MATCH "the water dew point is not assessed")
zcorr_cli_test(NAME phase_dewpoint_help_caution ARGS dewpoint --help MATCH "CAUTION: custody-transfer")

# The near-dew margin: 0 turns the flag off (the same rows, G05 at 273.15 K / 2000 kPa plain ok),
# 1 K leaves that state (1.4 K above its dew temperature) unflagged too; out of range refused.
zcorr_cli_test(NAME phase_z_dew_margin_off ARGS z --method gerg2008 --dew-margin 0 --input ${CLI_DATA}/phase_states.csv EXPECT_EXIT 1
               MATCH "G05_T273\\.15_P2000,[^\n]*,0\\.948[0-9]+,[0-9.]+,ok\n")
zcorr_cli_test(NAME phase_z_dew_margin_1K ARGS z --method gerg2008 --dew-margin "1 K" --input ${CLI_DATA}/phase_states.csv EXPECT_EXIT 1
               MATCH "G05_T273\\.15_P2000,[^\n]*,0\\.948[0-9]+,[0-9.]+,ok\n")
zcorr_cli_test(NAME phase_z_dew_margin_bad ARGS z --method gerg2008 --dew-margin 80 --T 273.15K --p 2000kPa --gas methane=0.95,ethane=0.04,n_hexane=0.01
               EXPECT_EXIT 2 MATCH "--dew-margin[^\n]*80[^\n]*0 K to 50 K")
# Single state near the dew point: the status and a note say so.
zcorr_cli_test(NAME phase_z_single_near_dew
               ARGS z --method gerg2008 --T 273.15K --p 2000kPa --gas methane=0.9250600,nitrogen=0.0215925,carbon_dioxide=0.0084963,ethane=0.0376191,propane=0.0024881,n_butane=0.0001445,isobutane=0.0001874,n_pentane=0.0005678,isopentane=0.0012766,n_hexane=0.0003014,n_heptane=0.0001642,n_octane=0.0000917,n_nonane=0.0000163,n_decane=0.0000065,oxygen=0.0000803,hydrogen_sulfide=0.0001765,helium=0.0017308
               MATCH "status   ok;near_dew_point[^\n]*\nnote     single-phase, but less than 5 K above the hydrocarbon dew temperature")
# The other methods flag it too, given the full analysis.
zcorr_cli_test(NAME phase_z_detail_near_dew ARGS z --method detail --input ${CLI_DATA}/phase_states.csv
               MATCH "G05_T273\\.15_P2000,[^\n]*,0\\.948[0-9]+,[0-9.]+,ok[^\n]*;near_dew_point\n")
