// SPDX-License-Identifier: MIT
// SPICE deck writer: each branch expanded into R/L/C primitives (see spice_netlist.hpp),
// generated names, exact count scaling, and loud warnings for what SPICE cannot say.
#include "quietrail/io/spice_netlist.hpp"

#include <charconv>
#include <cmath>
#include <string_view>
#include <variant>

#include "quietrail/error.hpp"
#include "quietrail/io/atomic_file.hpp"
#include "quietrail/network/topology.hpp"
#include "detail/overloaded.hpp"

namespace quietrail {
namespace {

constexpr std::size_t kMaxNameLength = 32;


// Shortest text that reads back as the same double (std::to_chars round-trip guarantee),
// so the deck carries the model's values exactly.
std::string number(double value) {
  char buffer[64];
  const auto result = std::to_chars(buffer, buffer + sizeof buffer, value);
  QUIETRAIL_ASSERT(result.ec == std::errc());
  return std::string(buffer, result.ptr);
}

// Letters, digits and '_' only: safe as part of any SPICE node or element name.
std::string sanitize(std::string_view name) {
  std::string out;
  for (const char c : name.substr(0, kMaxNameLength)) {
    const bool keep = (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || (c >= '0' && c <= '9') || c == '_';
    out.push_back(keep ? c : '_');
  }
  return out;
}

// Printable ASCII only, so a name cannot end a comment line or upset ngspice's UTF-8 scan.
std::string comment_text(std::string_view text) {
  std::string out;
  for (const char c : text) out.push_back(c >= 0x20 && c < 0x7f ? c : '?');
  return out;
}

std::string in_quotes(std::string_view name) {
  std::string out = "'";
  out += comment_text(name);
  out += '\'';
  return out;
}

struct Primitive {
  char letter;       // 'R', 'L' or 'C'
  const char* role;  // part of the element name
  double value;      // for ONE copy; scaled by the count when written
};
using Section = std::vector<Primitive>;  // primitives in parallel between two chain nodes

struct Expansion {
  std::vector<Section> sections;  // in series from the branch's `from` node to its `to` node
  std::vector<std::string> omitted;
};

// Series sections for one copy of the part; absent terms (zero series R or L, infinite
// parallel R, zero parallel C) are left out.
Expansion expand(const MountedPart& part) {
  Expansion e;
  auto series_r = [&](const char* role, double r) {
    if (r > 0.0) e.sections.push_back({{'R', role, r}});
  };
  auto series_l = [&](const char* role, double l) {
    if (l > 0.0) e.sections.push_back({{'L', role, l}});
  };
  const double mount = part.mounting_inductance;
  std::visit(detail::Overloaded{
                 [&](const Capacitor& c) {
                   series_r("esr", c.esr);
                   series_l("esl", c.esl + mount);
                   Section shunt{{'C', "c", c.capacitance}};
                   if (std::isfinite(c.leakage_resistance)) shunt.push_back({'R', "leak", c.leakage_resistance});
                   e.sections.push_back(shunt);
                   if (c.dissipation_factor > 0.0)
                     e.omitted.push_back("dissipation factor " + number(c.dissipation_factor) +
                                         " (dielectric loss conductance 2*pi*f*C*tan(delta))");
                   if (c.skin_corner > 0.0)
                     e.omitted.push_back("skin-effect ESR rise above " + number(c.skin_corner) +
                                         " Hz (the deck keeps the low-frequency ESR)");
                 },
                 [&](const Inductor& l) {
                   series_r("dcr", l.dc_resistance);
                   series_l("mount", mount);
                   Section tank{{'L', "l", l.inductance}};
                   if (std::isfinite(l.core_loss_resistance)) tank.push_back({'R', "core", l.core_loss_resistance});
                   if (l.parallel_capacitance > 0.0) tank.push_back({'C', "cp", l.parallel_capacitance});
                   e.sections.push_back(tank);
                 },
                 [&](const Resistor& r) {
                   series_r("r", r.resistance);
                   series_l("l", r.series_inductance + mount);
                 },
                 [&](const Regulator& r) {
                   series_r("r", r.resistance);
                   series_l("l", r.inductance + mount);
                 },
                 [&](const PlanePair& p) {
                   series_r("rs", p.series_resistance);
                   series_l("ls", p.spreading_inductance + mount);
                   e.sections.push_back({{'C', "c", p.capacitance()}});
                   if (p.loss_tangent > 0.0)
                     e.omitted.push_back("loss tangent " + number(p.loss_tangent) +
                                         " (dielectric loss conductance 2*pi*f*C*tan(delta))");
                 },
             },
             part.element);
  return e;
}

// One copy's value as written for `count` copies in parallel: R/N, L/N, N*C.
double scaled(const Primitive& p, int count) {
  const double n = static_cast<double>(count);
  return p.letter == 'C' ? p.value * n : p.value / n;
}

}  // namespace

void SpiceNetlistOptions::validate() const {
  sweep.validate();
  require_input(!output_file.empty(), {"", "output_file"}, "a file name for the wrdata output", "an empty name");
  for (const char c : output_file)
    require_input(!(c == ' ' || c == '\t' || c == '\n' || c == '\r' || c == '"' || c == '\'' || c == ';'),
                  {"", "output_file"}, "a file name without whitespace, quotes or ';'",
                  in_quotes(output_file));
}

SpiceNetlist spice_netlist(const Network& network, NodeId port, const SpiceNetlistOptions& options) {
  options.validate();
  check_topology(network, port);

  std::vector<std::string> node(network.node_count());
  node[Network::kGround] = "0";
  for (std::size_t i = 1; i < node.size(); ++i)
    node[i] = "n" + std::to_string(i) + "_" + sanitize(network.node_names()[i]);

  SpiceNetlist out;
  out.port_node = node[static_cast<std::size_t>(port)];
  std::string body;
  const auto& branches = network.branches();
  for (std::size_t k = 0; k < branches.size(); ++k) {
    const auto& b = branches[k];
    const Expansion e = expand(b.part);
    const std::string tag = std::to_string(k + 1) + "_" + sanitize(b.name);
    body += "* branch " + in_quotes(b.name) + ": " + std::string(element_kind(b.part.element)) + " x" +
            std::to_string(b.part.count) + ", mounting " + number(b.part.mounting_inductance) + " H, from " +
            in_quotes(network.node_name(b.from)) + " to " + in_quotes(network.node_name(b.to)) + "\n";
    for (const auto& term : e.omitted) {
      std::string warning = "branch " + in_quotes(b.name) + ": " + term +
                            " has no exact R/L/C equivalent and is omitted from the deck";
      body += "* WARNING: " + warning + "\n";
      out.warnings.push_back(std::move(warning));
    }
    QUIETRAIL_ASSERT(!e.sections.empty());  // check_topology rejected ideal shorts
    std::string left = node[static_cast<std::size_t>(b.from)];
    for (std::size_t s = 0; s < e.sections.size(); ++s) {
      const std::string right =
          s + 1 == e.sections.size() ? node[static_cast<std::size_t>(b.to)] : "b" + std::to_string(k + 1) + "_" + std::to_string(s + 1);
      for (const auto& p : e.sections[s])
        body += std::string(1, p.letter) + tag + "_" + p.role + " " + left + " " + right + " " +
                number(scaled(p, b.part.count)) + "\n";
      left = right;
    }
  }

  std::string& deck = out.text;
  deck += comment_text(options.title) + "\n";
  deck += "* Impedance of node " + in_quotes(network.node_name(port)) + " (" + out.port_node + ") against ground " +
          in_quotes(network.node_name(Network::kGround)) + ": V(" + out.port_node +
          ") in volts for a 1 A AC current source is Z in ohm.\n";
  deck += "* Values in SI units (ohm, H, F); counts are folded into the values (R/N, L/N, N*C).\n";
  if (!out.warnings.empty()) {
    deck += "* WARNING: " + std::to_string(out.warnings.size()) +
            " frequency-dependent term(s) could not be expressed with R/L/C primitives and were omitted;\n"
            "* WARNING: this deck shows less loss than the model at the frequencies where they matter.\n";
    for (const auto& w : out.warnings) deck += "* WARNING: " + w + "\n";
  }
  deck += "*\n" + body;
  deck += "* 1 A AC current into the port (current flows from node 0 through the source into the port)\n";
  deck += "Iport 0 " + out.port_node + " DC 0 AC 1\n";
  deck += ".option noopac\n";
  deck += ".ac dec " + std::to_string(options.sweep.points_per_decade) + " " + number(options.sweep.start) + " " +
          number(options.sweep.stop) + "\n";
  deck += ".control\n";
  deck += "set wr_singlescale\n";
  deck += "set wr_vecnames\n";
  deck += "set numdgt=15\n";
  deck += "run\n";
  deck += "wrdata " + options.output_file + " v(" + out.port_node + ")\n";
  deck += "quit 0\n";
  deck += ".endc\n";
  deck += ".end\n";
  return out;
}

std::vector<std::string> write_spice_netlist(const std::filesystem::path& path, const Network& network,
                                             NodeId port, const SpiceNetlistOptions& options) {
  SpiceNetlist netlist = spice_netlist(network, port, options);
  write_file_atomically(path, netlist.text);
  return std::move(netlist.warnings);
}

}  // namespace quietrail
