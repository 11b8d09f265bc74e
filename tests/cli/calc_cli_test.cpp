// SPDX-License-Identifier: MIT
// End-to-end checks of `quietrail calc`: runs the built binary and reads its output,
// JSON and exit status.
#include <catch2/catch.hpp>

#include <sys/wait.h>
#include <unistd.h>

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

#include <nlohmann/json.hpp>

using Catch::Matchers::Contains;
using Catch::Matchers::WithinRel;

namespace {

constexpr double kPrinted = 1e-3;  // values printed to 4-5 significant figures

struct Run {
  int status = -1;
  std::string out;
  std::string err;
};

std::string slurp(const std::filesystem::path& path) {
  std::ifstream in(path);
  std::stringstream text;
  text << in.rdbuf();
  return text.str();
}

// Runs the quietrail binary with `args` (already shell-quoted where needed).
Run run(const std::string& args) {
  static int serial = 0;
  const auto dir = std::filesystem::temp_directory_path();
  const std::string stem =
      "quietrail_calc_cli_" + std::to_string(::getpid()) + "_" + std::to_string(serial++);
  const auto out = dir / (stem + ".out");
  const auto err = dir / (stem + ".err");
  const std::string command = std::string("'") + QUIETRAIL_CLI_PATH + "' " + args + " >'" + out.string() +
                              "' 2>'" + err.string() + "'";
  const int raw = std::system(command.c_str());
  Run r;
  r.status = WIFEXITED(raw) ? WEXITSTATUS(raw) : -1;
  r.out = slurp(out);
  r.err = slurp(err);
  std::filesystem::remove(out);
  std::filesystem::remove(err);
  return r;
}

nlohmann::json json_of(const Run& r) {
  REQUIRE(r.status == 0);
  return nlohmann::json::parse(r.out);
}

}  // namespace

TEST_CASE("calc resonance prints the missing inductance for 10 MHz and 1 pF", "[cli]") {
  // Common practice: about 253 uH (1/((2 pi 10 MHz)^2 1 pF) = 253.3 uH).
  const Run r = run("calc resonance --frequency 10MHz --capacitance 1p");
  CHECK(r.status == 0);
  CHECK_THAT(r.out, Contains("253.3 uH"));
}

TEST_CASE("calc resonance --json holds the frequency in Hz", "[cli]") {
  // REFERENCES section 2: 100 nF with 0.5 nH -> 22.508 MHz.
  const auto j = json_of(run("calc resonance --capacitance 100n --inductance 0.5nH --json"));
  CHECK_THAT(j.at("results").at("frequency").get<double>(), WithinRel(22.508e6, kPrinted));
  CHECK(j.at("units").at("frequency") == "Hz");
}

TEST_CASE("calc resonance needs exactly two quantities", "[cli]") {
  const Run one = run("calc resonance --frequency 10MHz");
  CHECK(one.status == 2);
  CHECK_THAT(one.err, Contains("exactly two"));
  const Run three = run("calc resonance -f 1M -L 1n -C 1u");
  CHECK(three.status == 2);
}

TEST_CASE("calc self-resonance reports SRF and Q of a mounted part", "[cli]") {
  // REFERENCES section 2: 100 nF, 0.5 nH (0.4 body + 0.1 mounting), 20 mohm -> 22.508 MHz, Q 3.536.
  const auto j = json_of(
      run("calc self-resonance --capacitance 100n --esl 0.4n --mounting-inductance 0.1n --esr 20m --json"));
  CHECK_THAT(j.at("results").at("frequency").get<double>(), WithinRel(22.508e6, kPrinted));
  CHECK_THAT(j.at("results").at("quality_factor").get<double>(), WithinRel(3.536, kPrinted));
  const Run text = run("calc self-resonance --capacitance 100n --esl 0.5n --esr 20m");
  CHECK_THAT(text.out, Contains("22.51 MHz"));
}

TEST_CASE("calc wire gives 50.84 nH for 2 in of 22 AWG", "[cli]") {
  // Rosa 1908 (REFERENCES section 4): 50.84 nH with d = 0.644 mm; the gauge formula's
  // 0.6438 mm gives 50.85 nH, the same to 1e-3.
  const auto j = json_of(run("calc wire --length 2in --awg 22 --json"));
  CHECK_THAT(j.at("results").at("low_frequency").get<double>(), WithinRel(50.84e-9, kPrinted));
  CHECK_THAT(j.at("results").at("high_frequency").get<double>(), WithinRel(48.30e-9, kPrinted));
}

TEST_CASE("calc via accepts inches and gives Johnson & Graham's 1.2 nH", "[cli]") {
  // Johnson & Graham 1993 worked example (dimensions from memory): 1.202 nH.
  const Run r = run("calc via --length 0.063in --diameter 0.016in");
  CHECK(r.status == 0);
  CHECK_THAT(r.out, Contains("1.202 nH"));
}

TEST_CASE("calc skin gives the copper skin depth and AC resistance of 22 AWG at 1 MHz", "[cli]") {
  // REFERENCES section 5: delta 66.08 um, exact R_ac 143.2 mohm/m (ratio 2.705).
  const auto j = json_of(run("calc skin --frequency 1MHz --diameter 0.644mm --json"));
  CHECK_THAT(j.at("results").at("skin_depth").get<double>(), WithinRel(66.08e-6, kPrinted));
  CHECK_THAT(j.at("results").at("exact_resistance").get<double>(), WithinRel(143.2e-3, kPrinted));
}

TEST_CASE("calc plane and cavity reproduce the 10 x 8 in worked values", "[cli]") {
  // REFERENCES section 7: 19.34 nF at 4 mil, er 4.3; f10 = 284.59 MHz, f01 = 355.74 MHz.
  const Run plane = run("calc plane --length 10in --width 8in --separation 4mil");
  CHECK_THAT(plane.out, Contains("19.34 nF"));
  const auto j = json_of(run("calc cavity --length 10in --width 8in --count 2 --json"));
  const auto& modes = j.at("results").at("modes");
  REQUIRE(modes.size() == 2);
  CHECK_THAT(modes[0].at("frequency").get<double>(), WithinRel(284.59e6, kPrinted));
  CHECK_THAT(modes[1].at("frequency").get<double>(), WithinRel(355.74e6, kPrinted));
}

TEST_CASE("calc target accepts a percentage ripple", "[cli]") {
  // REFERENCES section 1: 1.0 V, 5 %, I_max 10 A, 50 % step -> 10.0 mohm; 10 A step -> 5 mohm.
  const Run r = run("calc target --voltage 1.0 --ripple 5% --max-current 10");
  CHECK(r.status == 0);
  CHECK_THAT(r.out, Contains("10 mohm"));
  const auto j = json_of(run("calc target --voltage 1.0 --ripple 0.05 --current-step 10 --json"));
  CHECK_THAT(j.at("results").at("impedance").get<double>(), WithinRel(5e-3, 1e-9));
}

TEST_CASE("a bad value exits 2 and names the option", "[cli]") {
  const Run unparsable = run("calc resonance --capacitance 100x --inductance 1n");
  CHECK(unparsable.status == 2);
  CHECK_THAT(unparsable.err, Contains("--capacitance"));
  const Run negative = run("calc via --length 1.6mm --diameter -0.3mm");
  CHECK(negative.status == 2);
  CHECK_THAT(negative.err, Contains("--diameter"));
  const Run ripple = run("calc target --voltage 1 --ripple 5 --current-step 1");
  CHECK(ripple.status == 2);
  CHECK_THAT(ripple.err, Contains("--ripple"));
  const Run nan = run("calc skin --frequency nan");
  CHECK(nan.status == 2);
  CHECK_THAT(nan.err, Contains("--frequency"));
  CHECK(nan.out.empty());
}

TEST_CASE("every calc sub-command has --help", "[cli]") {
  for (const char* sub :
       {"resonance", "self-resonance", "wire", "via", "skin", "plane", "cavity", "target"}) {
    CAPTURE(sub);
    const Run r = run(std::string("calc ") + sub + " --help");
    CHECK(r.status == 0);
    CHECK_THAT(r.out, Contains("Example"));
  }
}
