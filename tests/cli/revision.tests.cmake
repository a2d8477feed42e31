# The engine revision: `zcorr --version` states the version and the source
# revision on its first line (DEVELOPERS.md interface contract 7).
zcorr_cli_test(NAME version ARGS --version
               MATCH "^zcorr [0-9]+\\.[0-9]+\\.[0-9]+ \\(revision [A-Za-z0-9._+-]+\\)\ninterval log: schema version [0-9]+.*CAUTION")
