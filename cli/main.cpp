// zcorr: the command-line tool. main only wires the commands.
#include <CLI/CLI.hpp>

#include <functional>

#include "commands.hpp"
#include "common.hpp"
#include "record/log.hpp"

int main(int argc, char** argv) {
  CLI::App app{"zcorr: compressibility factors and base-volume corrections for natural-gas measurement"};
  app.footer(std::string("\nExamples:\n"
                         "  zcorr z --method gerg2008 --T \"15 degC\" --p \"5 MPa\" --gas \"methane=0.95,ethane=0.03,nitrogen=0.02\"\n"
                         "  zcorr props --gas \"methane=0.95,ethane=0.03,nitrogen=0.02\" --combustion-ref 25 --metering-ref 0\n"
                         "  zcorr cases\n\n") +
             zcorr::cli::caution_text);
  // Contract: the first line is the version and the source revision.
  app.set_version_flag("--version",
                       std::string(zcorr::record::engine_version()) + "\ninterval log: schema version " +
                           std::to_string(zcorr::record::latest_schema_version) + ", record encoding zcorr.record.v" +
                           std::to_string(zcorr::record::latest_encoding) + "\n\n" + zcorr::cli::caution_text,
                       "Print the version and the source revision (first line) and exit");
  app.require_subcommand(1);
  int exit_code = 0;
  zcorr::cli::setup_z(app, exit_code);
  zcorr::cli::setup_convert(app, exit_code);
  zcorr::cli::setup_cases(app, exit_code);
  zcorr::cli::setup_demo(app, exit_code);
  zcorr::cli::setup_validate(app, exit_code);
  zcorr::cli::setup_props(app, exit_code);
  zcorr::cli::setup_record(app, exit_code);
  zcorr::cli::setup_verify(app, exit_code);
  zcorr::cli::setup_quantities(app, exit_code);
  zcorr::cli::setup_audit(app, exit_code);
  zcorr::cli::setup_correct(app, exit_code);
  zcorr::cli::setup_dewpoint(app, exit_code);
  // Every command's --help ends with the caution (those that state it already keep theirs).
  std::function<void(CLI::App*)> caution_in_help = [&](CLI::App* a) {
    for (CLI::App* sub : a->get_subcommands([](CLI::App*) { return true; })) {
      if (sub->get_footer().find("CAUTION") == std::string::npos) sub->footer(sub->get_footer() + "\n" + zcorr::cli::caution_text);
      caution_in_help(sub);
    }
  };
  caution_in_help(&app);
  try {
    app.parse(argc, argv);
  } catch (const CLI::CallForHelp& e) {
    return app.exit(e);
  } catch (const CLI::CallForAllHelp& e) {
    return app.exit(e);
  } catch (const CLI::Success& e) {
    return app.exit(e);
  } catch (const CLI::ParseError& e) {
    app.exit(e);
    return zcorr::cli::exit_unusable;
  }
  return exit_code;
}
