// SPDX-License-Identifier: MIT
// Reading a board designer's BOM export (CSV) and resolving each line to a library part.
// The format and the matching rules are documented in docs/project_file.md.
#include "quietrail/io/bom_csv.hpp"

#include <algorithm>
#include <cctype>
#include <charconv>
#include <cmath>
#include <map>
#include <optional>
#include <set>
#include <tuple>

#include "detail/checks.hpp"
#include "detail/text.hpp"
#include "io/json_support.hpp"
#include "quietrail/error.hpp"
#include "quietrail/units.hpp"

namespace quietrail {
namespace {


// A designator range longer than this is a typo, not a BOM (common practice: even large
// boards carry a few thousand capacitors).
constexpr long kMaxRange = 100000;

// ---------------------------------------------------------------- columns

enum class Column { value, quantity, designators, package, dielectric, voltage, part_id };

struct ColumnNames {
  Column column;
  std::vector<std::string_view> names;  // normalised: lower case, no ' ', '_', '-', '.'
};

const std::vector<ColumnNames> kColumns{
    {Column::value, {"value", "description", "comment", "desc", "partdescription", "val"}},
    {Column::quantity, {"qty", "quantity", "count", "qnty"}},
    {Column::designators, {"designator", "designators", "reference", "references", "ref", "refdes", "refs"}},
    {Column::package, {"package", "footprint", "case", "size"}},
    {Column::dielectric, {"dielectric", "tc"}},
    {Column::voltage, {"voltage", "rating", "ratedvoltage", "voltagerating"}},
    {Column::part_id, {"partid", "libraryid", "id"}},
};

std::string normalise_header(std::string_view text) {
  std::string out;
  for (const char c : text) {
    if (c == ' ' || c == '_' || c == '-' || c == '.' || c == '\t') continue;
    out += static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  }
  return out;
}

std::string trim(std::string_view text) { return detail::trim_blanks(text); }
std::string lower(std::string_view text) { return detail::lower_ascii(text); }

// Column positions by role; the value role may have several columns.
struct Layout {
  std::map<Column, std::vector<std::size_t>> at;
  std::vector<std::string> headers;

  const std::vector<std::size_t>* find(Column c) const {
    const auto it = at.find(c);
    return it == at.end() ? nullptr : &it->second;
  }
  std::string header(Column c) const {
    const auto* cols = find(c);
    return cols ? headers[cols->front()] : std::string();
  }
};

std::string names_of(Column c) {
  for (const auto& entry : kColumns)
    if (entry.column == c) {
      std::string out;
      for (const auto name : entry.names) out.append(out.empty() ? "" : ", ").append(name);
      return out;
    }
  QUIETRAIL_ASSERT(false);
  return {};
}

Layout read_header(const CsvRecord& header, const std::string& file) {
  Layout layout;
  for (std::size_t i = 0; i < header.cells.size(); ++i) {
    const std::string cell = trim(header.cells[i]);
    layout.headers.push_back(cell);
    const std::string norm = normalise_header(cell);
    for (const auto& entry : kColumns)
      if (std::find(entry.names.begin(), entry.names.end(), norm) != entry.names.end())
        layout.at[entry.column].push_back(i);
  }
  for (const auto& [column, positions] : layout.at) {
    if (column != Column::value && positions.size() > 1)
      throw InputError({file, "header", header.line},
                       "at most one column for each role (" + names_of(column) + ")",
                       "the columns " + detail::quoted(layout.headers[positions[0]]) + " and " +
                           detail::quoted(layout.headers[positions[1]]));
  }
  const bool has_value = layout.find(Column::value) || layout.find(Column::part_id);
  const bool has_count = layout.find(Column::quantity) || layout.find(Column::designators);
  if (!has_value || !has_count) {
    std::string found;
    for (const auto& h : layout.headers) found.append(found.empty() ? "" : ", ").append(detail::quoted(h));
    std::string expected = "a header row with ";
    if (!has_value)
      expected += "a value or description column (" + names_of(Column::value) + "; or a library id column: " +
                  names_of(Column::part_id) + ")";
    if (!has_value && !has_count) expected += " and ";
    if (!has_count)
      expected += "a quantity column (" + names_of(Column::quantity) + ") or a designator column (" +
                  names_of(Column::designators) + ")";
    expected += "; names are matched ignoring case, spaces, '_', '-' and '.'";
    throw InputError({file, "header", header.line}, expected, "the columns " + found);
  }
  return layout;
}

// ---------------------------------------------------------------- the line's text

// What the tokens of a line say about the part.
struct LineFacts {
  std::optional<double> value;
  std::optional<PartKind> kind;
  std::string value_token;
  std::optional<std::string> package;
  std::optional<Dielectric> dielectric;
  std::optional<double> rating;
};

bool has_letter(std::string_view token) {
  return std::any_of(token.begin(), token.end(), [](char c) { return std::isalpha(static_cast<unsigned char>(c)); });
}

bool ends_with_ci(std::string_view text, std::string_view suffix) {
  if (text.size() < suffix.size()) return false;
  return lower(text.substr(text.size() - suffix.size())) == suffix;
}

std::optional<double> try_parse(std::string_view token, std::string_view unit) {
  try {
    return parse_value(token, unit, {});
  } catch (const InputError&) {
    return std::nullopt;
  }
}

// The MLCC package code inside `text` ("0402", "C0402", "0402 (1005 metric)"): the first
// four-digit run that parse_package accepts.
std::optional<std::string> package_code_in(std::string_view text) {
  for (std::size_t i = 0; i + 4 <= text.size(); ++i) {
    const bool starts = i == 0 || !std::isdigit(static_cast<unsigned char>(text[i - 1]));
    const bool ends = i + 4 == text.size() || !std::isdigit(static_cast<unsigned char>(text[i + 4]));
    if (!starts || !ends) continue;
    const std::string_view run = text.substr(i, 4);
    if (std::all_of(run.begin(), run.end(), [](char c) { return std::isdigit(static_cast<unsigned char>(c)); }) &&
        parse_package(run))
      return std::string(run);
  }
  return std::nullopt;
}

std::vector<std::string> tokens_of(std::string_view text) {
  std::vector<std::string> out;
  std::string current;
  for (const char c : text) {
    if (c == ' ' || c == ',' || c == ';' || c == '/' || c == '\t' || c == '\n' || c == '\r' || c == '(' ||
        c == ')') {
      if (!current.empty()) out.push_back(current);
      current.clear();
    } else {
      current += c;
    }
  }
  if (!current.empty()) out.push_back(current);
  return out;
}

[[noreturn]] void line_error(const std::string& file, int line, const std::string& field, const std::string& expected,
                             const std::string& found) {
  throw InputError({file, field, line}, expected, found);
}

void note_value(LineFacts& facts, double value, PartKind kind, const std::string& token, const std::string& file,
                int line, const std::string& field) {
  if (facts.value) {
    const bool same = facts.kind == kind && std::abs(*facts.value - value) <= 1e-9 * std::abs(value);
    if (same) return;
    line_error(file, line, field, "one value per line", "both " + detail::quoted(facts.value_token) + " and " + detail::quoted(token));
  }
  facts.value = value;
  facts.kind = kind;
  facts.value_token = token;
}

// Reads the tokens of the value/description text.
void scan_text(std::string_view text, LineFacts& facts, const std::string& file, int line, const std::string& field) {
  for (const auto& token : tokens_of(text)) {
    if (token.find('%') != std::string::npos) continue;  // a tolerance such as "10%"
    if (ends_with_ci(token, "v") && token.size() > 1) {
      if (auto v = try_parse(token, "V")) {
        if (!facts.rating) facts.rating = *v;
        continue;
      }
    }
    if (auto code = package_code_in(token); code && code->size() == token.size()) {
      if (!facts.package) facts.package = *code;
      continue;
    }
    if (auto d = parse_dielectric(token); d && has_letter(token)) {
      if (!facts.dielectric) facts.dielectric = *d;
      continue;
    }
    if (!has_letter(token)) continue;  // a bare number says nothing about the unit
    if (auto c = try_parse(token, "F")) {
      note_value(facts, *c, PartKind::capacitor, token, file, line, field);
      continue;
    }
    if (auto l = try_parse(token, "H")) {
      note_value(facts, *l, PartKind::inductor, token, file, line, field);
      continue;
    }
    // A resistance names a bead by its |Z| at 100 MHz ("120R", "600ohm"); plain prefixed
    // numbers were taken as farads above, so only an explicit ohm spelling reaches here.
    if (auto r = try_parse(token, "ohm")) note_value(facts, *r, PartKind::bead, token, file, line, field);
  }
}

// ---------------------------------------------------------------- resolution

std::string describe_query(const LineFacts& facts, double min_voltage) {
  std::string out = std::string(to_string(*facts.kind)) + " " +
                    format_value(*facts.value, *facts.kind == PartKind::capacitor  ? "F"
                                               : *facts.kind == PartKind::inductor ? "H"
                                                                                   : "ohm");
  if (facts.package) out += ", package " + *facts.package;
  if (facts.dielectric) out += ", " + std::string(to_string(*facts.dielectric));
  if (min_voltage > 0.0) out += ", rated >= " + format_value(min_voltage, "V");
  return out;
}

std::string part_summary(const LibraryPart& part) {
  std::string out = part.id + " (";
  out += part.package.empty() ? std::string("no package") : part.package;
  if (part.dielectric != Dielectric::none) out += ", " + std::string(to_string(part.dielectric));
  if (part.rated_voltage > 0.0) out += ", " + format_value(part.rated_voltage, "V");
  out += ")";
  return out;
}

bool value_matches(const LibraryPart& part, double value, double tolerance) {
  const double v = matching_value(part);
  return std::abs(v - value) <= tolerance * value;
}

// The nearest parts when nothing matched: same kind, any package/dielectric/rating,
// closest value first (PartLibrary::candidates order).
std::string nearest_candidates(const PartLibrary& library, const LineFacts& facts) {
  PartQuery loose{.value = *facts.value, .kind = *facts.kind};
  std::vector<const LibraryPart*> near;
  // Prefer parts that keep the package and dielectric, so the suggestion shows what differs.
  PartQuery same_form = loose;
  same_form.package = facts.package;
  same_form.dielectric = facts.dielectric;
  for (const auto* p : library.candidates(same_form, 3)) near.push_back(p);
  for (const auto* p : library.candidates(loose, 3))
    if (near.size() < 4 && std::find(near.begin(), near.end(), p) == near.end()) near.push_back(p);
  if (near.empty()) return "no " + std::string(to_string(*facts.kind)) + " in the loaded libraries";
  std::string out = "nearest: ";
  for (std::size_t i = 0; i < near.size(); ++i) out.append(i ? ", " : "").append(part_summary(*near[i]));
  return out;
}

template <class Get>
std::set<std::string> distinct(const std::vector<const LibraryPart*>& parts, Get get) {
  std::set<std::string> out;
  for (const auto* p : parts) out.insert(get(*p));
  return out;
}

std::string join_set(const std::set<std::string>& items) {
  std::string out;
  for (const auto& item : items) out.append(out.empty() ? "" : ", ").append(item);
  return out;
}

const LibraryPart& resolve(const PartLibrary& library, const LineFacts& facts, const BomCsvOptions& options,
                           const std::string& text, const std::string& file, int line, const std::string& field) {
  const double min_voltage = facts.rating.value_or(options.default_min_voltage);
  PartQuery query{.value = *facts.value, .kind = *facts.kind, .package = facts.package,
                  .dielectric = facts.dielectric, .min_voltage = min_voltage};
  std::vector<const LibraryPart*> matches;
  for (const auto* p : library.candidates(query))
    if (value_matches(*p, *facts.value, options.value_tolerance)) matches.push_back(p);
  if (matches.empty())
    line_error(file, line, field, "a library part matching " + detail::quoted(text) + " (" + describe_query(facts, min_voltage) + ")",
               "none; " + nearest_candidates(library, facts));

  // Never guess a package or a dielectric the line does not give.
  if (!facts.package) {
    const auto packages = distinct(matches, [](const LibraryPart& p) { return p.package; });
    if (packages.size() > 1)
      line_error(file, line, field, "a package for " + detail::quoted(text) + " (the matching parts come in several)",
                 "no package; choices: " + join_set(packages));
  }
  if (!facts.dielectric && *facts.kind == PartKind::capacitor) {
    const auto kinds = distinct(matches, [](const LibraryPart& p) { return std::string(to_string(p.dielectric)); });
    if (kinds.size() > 1)
      line_error(file, line, field, "a dielectric for " + detail::quoted(text) + " (the matching parts come in several)",
                 "no dielectric; choices: " + join_set(kinds));
  }
  // Smallest adequate rating, then the lowest cost, then the id.
  const auto best = std::min_element(matches.begin(), matches.end(), [](const LibraryPart* a, const LibraryPart* b) {
    return std::tie(a->rated_voltage, a->cost, a->id) < std::tie(b->rated_voltage, b->cost, b->id);
  });
  return **best;
}

int parse_count(const std::string& text, const std::string& file, int line, const std::string& field) {
  int value = 0;
  const char* first = text.data();
  const char* last = text.data() + text.size();
  const auto [end, error] = std::from_chars(first, last, value);
  if (text.empty() || error != std::errc() || end != last || value < 1)
    line_error(file, line, field, "a whole number >= 1", detail::quoted(text));
  return value;
}

}  // namespace

// ---------------------------------------------------------------- public

void BomCsvOptions::validate() const {
  require_input(std::isfinite(default_min_voltage) && default_min_voltage >= 0.0, {"", "default_min_voltage"},
                "a voltage >= 0 V", detail::describe_number(default_min_voltage, "V"));
  require_input(std::isfinite(value_tolerance) && value_tolerance >= 0.0 && value_tolerance < 0.5,
                {"", "value_tolerance"}, "a fraction in [0, 0.5)", detail::describe_number(value_tolerance, ""));
}

std::vector<CsvRecord> split_csv(std::string_view text, const std::string& file) {
  std::vector<CsvRecord> records;
  std::size_t i = 0;
  if (text.substr(0, 3) == "\xEF\xBB\xBF") i = 3;  // UTF-8 byte order mark
  int line = 1;
  CsvRecord record{.line = 1, .cells = {}};
  std::string cell;
  bool in_record = false;  // any character of the record seen
  auto end_record = [&] {
    record.cells.push_back(cell);
    cell.clear();
    const bool blank = record.cells.size() == 1 && trim(record.cells[0]).empty();
    if (!blank) records.push_back(record);
    record = CsvRecord{.line = line, .cells = {}};
    in_record = false;
  };
  while (i < text.size()) {
    const char c = text[i];
    if (c == '"' && trim(cell).empty()) {
      // A quoted field: up to the closing quote, "" stands for one quote.
      const int start_line = line;
      cell.clear();
      ++i;
      bool closed = false;
      while (i < text.size()) {
        if (text[i] == '"') {
          if (i + 1 < text.size() && text[i + 1] == '"') {
            cell += '"';
            i += 2;
            continue;
          }
          ++i;
          closed = true;
          break;
        }
        if (text[i] == '\n') ++line;
        cell += text[i++];
      }
      if (!closed)
        throw InputError({file, "", start_line}, "a closing double quote for the field opened here",
                         "the end of the file");
      // Only blanks may follow before the separator.
      while (i < text.size() && (text[i] == ' ' || text[i] == '\t')) ++i;
      if (i < text.size() && text[i] != ',' && text[i] != '\n' && text[i] != '\r')
        throw InputError({file, "", line}, "a comma or the end of the line after a closing quote",
                         detail::quoted(std::string(1, text[i])));
      in_record = true;
      continue;
    }
    if (c == ',') {
      record.cells.push_back(cell);
      cell.clear();
      in_record = true;
      ++i;
      continue;
    }
    if (c == '\r' || c == '\n') {
      if (c == '\r' && i + 1 < text.size() && text[i + 1] == '\n') ++i;
      ++i;
      end_record();
      ++line;
      record.line = line;
      continue;
    }
    cell += c;
    in_record = true;
    ++i;
  }
  if (in_record || !cell.empty()) end_record();
  return records;
}

std::vector<std::string> expand_designators(std::string_view text, const InputLocation& where) {
  std::vector<std::string> out;
  std::string current;
  std::vector<std::string> items;
  for (const char c : text) {
    if (c == ',' || c == ';' || c == ' ' || c == '\t') {
      if (!current.empty()) items.push_back(current);
      current.clear();
    } else {
      current += c;
    }
  }
  if (!current.empty()) items.push_back(current);
  require_input(!items.empty(), where, "a designator list such as \"C1, C2, C5-C8\"", "an empty cell");

  // "C12" -> ("C", 12); the number is the trailing digits.
  auto split = [](std::string_view d) -> std::optional<std::pair<std::string, long>> {
    std::size_t k = d.size();
    while (k > 0 && std::isdigit(static_cast<unsigned char>(d[k - 1]))) --k;
    if (k == d.size() || d.size() - k > 9) return std::nullopt;
    long n = 0;
    std::from_chars(d.data() + k, d.data() + d.size(), n);
    return std::make_pair(std::string(d.substr(0, k)), n);
  };

  for (const auto& item : items) {
    const auto dash = item.find('-', 1);
    if (dash == std::string::npos) {
      out.push_back(item);
      continue;
    }
    const std::string left = item.substr(0, dash);
    std::string right = item.substr(dash + 1);
    const auto a = split(left);
    auto b = split(right);
    const std::string expected = "a designator range such as \"C5-C8\" or \"C5-8\" (same prefix, ascending)";
    if (!a || !b) throw InputError(where, expected, detail::quoted(item));
    if (b->first.empty()) b->first = a->first;
    if (b->first != a->first || b->second < a->second || b->second - a->second >= kMaxRange)
      throw InputError(where, expected, detail::quoted(item));
    for (long n = a->second; n <= b->second; ++n) out.push_back(a->first + std::to_string(n));
  }
  return out;
}

std::vector<BomCsvLine> parse_bom_csv(std::string_view text, const std::string& file, const PartLibrary& library,
                                      const BomCsvOptions& options) {
  options.validate();
  const std::vector<CsvRecord> records = split_csv(text, file);
  if (records.empty()) throw InputError({file, ""}, "a BOM with a header row and part lines", "an empty file");
  const Layout layout = read_header(records.front(), file);

  auto cell = [&](const CsvRecord& r, Column c) -> std::optional<std::string> {
    const auto* cols = layout.find(c);
    if (!cols) return std::nullopt;
    const std::size_t i = cols->front();
    if (i >= r.cells.size()) return std::nullopt;
    std::string v = trim(r.cells[i]);
    if (v.empty()) return std::nullopt;
    return v;
  };

  std::vector<BomCsvLine> out;
  std::map<std::string, int> seen_designators;  // designator -> line
  for (std::size_t k = 1; k < records.size(); ++k) {
    const CsvRecord& r = records[k];
    if (r.cells.size() > layout.headers.size())
      line_error(file, r.line, "", "at most " + std::to_string(layout.headers.size()) + " cells (as in the header)",
                 std::to_string(r.cells.size()) + " cells");
    if (std::all_of(r.cells.begin(), r.cells.end(), [](const std::string& c) { return trim(c).empty(); }))
      continue;

    BomCsvLine entry;
    entry.line = r.line;

    // Text: every value/description column, for messages and tokens.
    if (const auto* cols = layout.find(Column::value))
      for (const std::size_t i : *cols)
        if (i < r.cells.size() && !trim(r.cells[i]).empty())
          entry.text.append(entry.text.empty() ? "" : " ").append(trim(r.cells[i]));

    // Count: designators and/or quantity, which must agree when both are given.
    const auto designators = cell(r, Column::designators);
    const auto quantity = cell(r, Column::quantity);
    if (designators) {
      entry.designators = *designators;
      entry.designator_list = expand_designators(*designators, {file, layout.header(Column::designators), r.line});
      for (const auto& d : entry.designator_list) {
        const auto [it, fresh] = seen_designators.emplace(d, r.line);
        if (!fresh)
          line_error(file, r.line, layout.header(Column::designators), "each designator on one line only",
                     detail::quoted(d) + ", also on line " + std::to_string(it->second));
      }
    }
    if (quantity) {
      entry.count = parse_count(*quantity, file, r.line, layout.header(Column::quantity));
      if (designators && static_cast<std::size_t>(entry.count) != entry.designator_list.size())
        line_error(file, r.line, layout.header(Column::quantity),
                   "a quantity equal to the number of designators (" + std::to_string(entry.designator_list.size()) +
                       " in " + detail::quoted(*designators) + ")",
                   detail::quoted(*quantity));
    } else if (designators) {
      entry.count = static_cast<int>(entry.designator_list.size());
    } else {
      const std::string field =
          layout.find(Column::quantity) ? layout.header(Column::quantity) : layout.header(Column::designators);
      line_error(file, r.line, field, "a quantity or a designator list", "an empty cell");
    }

    // A library id resolves the line directly.
    if (const auto id = cell(r, Column::part_id)) {
      const LibraryPart* part = library.find(*id);
      if (!part) {
        std::string near;
        for (const auto& n : library.nearest(*id)) near.append(near.empty() ? "" : ", ").append(n);
        line_error(file, r.line, layout.header(Column::part_id), "a part id of the loaded libraries",
                   detail::quoted(*id) + (near.empty() ? std::string() : "; nearest: " + near));
      }
      entry.part_id = part->id;
      if (entry.text.empty()) entry.text = part->id;
      out.push_back(std::move(entry));
      continue;
    }

    const std::string value_field = layout.find(Column::value) ? layout.header(Column::value) : std::string("value");
    LineFacts facts;
    scan_text(entry.text, facts, file, r.line, value_field);
    if (const auto p = cell(r, Column::package)) {
      const auto code = package_code_in(*p);
      facts.package = code ? *code : *p;
    }
    if (const auto d = cell(r, Column::dielectric)) {
      const auto parsed = parse_dielectric(*d);
      if (!parsed)
        line_error(file, r.line, layout.header(Column::dielectric), "a dielectric such as X7R, X5R or C0G", detail::quoted(*d));
      facts.dielectric = *parsed;
    }
    if (const auto v = cell(r, Column::voltage)) facts.rating = parse_value(*v, "V", {file, layout.header(Column::voltage), r.line});
    if (!facts.value)
      line_error(file, r.line, value_field,
                 "a value with its unit in the value or description text, such as \"100nF\", \"4u7\" or \"2.2uH\"",
                 entry.text.empty() ? std::string("an empty cell") : detail::quoted(entry.text));
    entry.part_id = resolve(library, facts, options, entry.text, file, r.line, value_field).id;
    out.push_back(std::move(entry));
  }
  if (out.empty())
    throw InputError({file, "", records.front().line}, "at least one part line after the header", "none");
  return out;
}

std::vector<BomCsvLine> read_bom_csv(const std::filesystem::path& path, const PartLibrary& library,
                                     const BomCsvOptions& options) {
  return parse_bom_csv(detail::read_text_file(path, "a readable BOM file (CSV)"), path.string(), library, options);
}

}  // namespace quietrail
