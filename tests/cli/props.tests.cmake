# zcorr props: ISO 6976:2016 properties of a gas analysis (good and bad input).
# ISO 12213 example gas 1 at 25/0 degC: Hs 40.66 MJ/m3 and d 0.581 (SGERG-88
# inputs of ISO 12213-3 Annex C, from memory, project standards notes; this
# engine gives 40.6604 and 0.58127).
set(ZCORR_PROPS_GAS1 "methane=0.965,nitrogen=0.003,carbon_dioxide=0.006,ethane=0.018,propane=0.0045,isobutane=0.001,n_butane=0.001,isopentane=0.0005,n_pentane=0.0003,n_hexane=0.0007")
zcorr_cli_test(NAME props_help ARGS props --help MATCH "Examples:.*zcorr props --gas")
zcorr_cli_test(NAME props_gas1_text ARGS props --gas ${ZCORR_PROPS_GAS1} --combustion-ref 25 --metering-ref 0
               MATCH "Hs_MJ_per_m3 +40\\.66[0-9]* +MJ/m3")
zcorr_cli_test(NAME props_gas1_d ARGS props --gas ${ZCORR_PROPS_GAS1} --combustion-ref 25 --metering-ref 0
               MATCH "\n  d +0\\.581[0-9]*")
# The provenance line names the doubtful rows (data-set confidence labels).
zcorr_cli_test(NAME props_provenance ARGS props --gas ${ZCORR_PROPS_GAS1} --combustion-ref 25 --metering-ref 0
               MATCH "provenance .*doubtful rows \\(below medium-high\\): methane \\(Hs medium\\), propane \\(Z/s medium\\)")
zcorr_cli_test(NAME props_clean_gas ARGS props --gas "ethane=0.9,nitrogen=0.06,carbon_dioxide=0.04" --combustion-ref 25 --metering-ref 15
               MATCH "status      ok\n.*doubtful rows \\(below medium-high\\): none")
zcorr_cli_test(NAME props_us_base_csv ARGS props --gas methane=1 --combustion-ref 15.55 --metering-ref "60 degF" --metering-p "14.73 psia" --format csv
               MATCH "^combustion_ref_C,metering_ref_C,metering_p_kPa,M_g_per_mol,Z,.*\n15\\.55,15\\.55,101\\.559774")
zcorr_cli_test(NAME props_json ARGS props --gas methane=1 --combustion-ref 25 --metering-ref 0 --format json
               MATCH "\"Hs_kJ_per_mol\": 890\\.58")
# Bad input: one line naming the field and value, exit 2 (issue 2, "Bad input").
zcorr_cli_test(NAME props_sum_0_9 ARGS props --gas methane=0.9 --combustion-ref 25 --metering-ref 0
               EXPECT_EXIT 2 MATCH "sum: '0\\.9' is not accepted")
zcorr_cli_test(NAME props_negative ARGS props --gas "methane=1.1,ethane=-0.1" --combustion-ref 25 --metering-ref 0
               EXPECT_EXIT 2 MATCH "ethane")
zcorr_cli_test(NAME props_bad_combustion_ref ARGS props --gas methane=1 --combustion-ref 30 --metering-ref 0
               EXPECT_EXIT 2 MATCH "--combustion-ref: '30' is not accepted")
zcorr_cli_test(NAME props_25C_is_not_a_metering_ref ARGS props --gas methane=1 --combustion-ref 25 --metering-ref 25
               EXPECT_EXIT 2 MATCH "--metering-ref: '25'")
zcorr_cli_test(NAME props_pressure_outside ARGS props --gas methane=1 --combustion-ref 25 --metering-ref 0 --metering-p "5 MPa"
               EXPECT_EXIT 2 MATCH "--metering-p: '5 MPa' is not accepted; not computed: out_of_range")
zcorr_cli_test(NAME props_no_gas ARGS props --combustion-ref 25 --metering-ref 0 EXPECT_EXIT 2 MATCH "--gas")
zcorr_cli_test(NAME props_missing_refs ARGS props --gas methane=1 EXPECT_EXIT 2 MATCH "combustion-ref")
# zcorr z --method iso6976: reference conditions only (DEVELOPERS.md contract 2).
# Methane at 15 degC: Z 0.99802 (ISO 6976:2016 Table 2, standards notes, medium-high).
zcorr_cli_test(NAME z_iso6976_reference ARGS z --method iso6976 --T "15 degC" --p "101.325 kPa" --gas methane=1
               MATCH "  Z +0\\.998019")
zcorr_cli_test(NAME z_iso6976_not_reference ARGS z --method iso6976 --T "27 degC" --p "101.325 kPa" --gas methane=1
               EXPECT_EXIT 1 MATCH "not computed: out_of_range")
