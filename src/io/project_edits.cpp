// SPDX-License-Identifier: MIT
// Edits on the project's JSON text (io/project_edits.hpp). Names are resolved against the
// base project as read, so an edit names lines exactly as check's parts table shows them;
// the edited text then goes back through the ordinary reader.
#include "quietrail/io/project_edits.hpp"

#include <algorithm>
#include <charconv>
#include <map>
#include <optional>

#include "detail/checks.hpp"
#include "detail/text.hpp"
#include "io/json_support.hpp"
#include "quietrail/error.hpp"
#include "quietrail/io/part_library.hpp"

namespace quietrail {
namespace {

using detail::child;
using detail::Json;

constexpr const char* kCommandLine = "command line";

[[noreturn]] void fail_at(const ProjectEdit& edit, const std::string& expected, const std::string& found) {
  throw InputError({edit.origin_file, edit.origin_field}, expected, found);
}

// Case-insensitive edit distance, for "nearest names" suggestions.
std::size_t edit_distance(std::string_view a, std::string_view b) {
  const std::string x = detail::lower_ascii(a);
  const std::string y = detail::lower_ascii(b);
  std::vector<std::size_t> row(y.size() + 1);
  for (std::size_t j = 0; j <= y.size(); ++j) row[j] = j;
  for (std::size_t i = 1; i <= x.size(); ++i) {
    std::size_t diagonal = row[0];
    row[0] = i;
    for (std::size_t j = 1; j <= y.size(); ++j) {
      const std::size_t above = row[j];
      row[j] = std::min({row[j] + 1, row[j - 1] + 1, diagonal + (x[i - 1] == y[j - 1] ? 0 : 1)});
      diagonal = above;
    }
  }
  return row[y.size()];
}

std::optional<int> parse_count(std::string_view text) {
  int value = 0;
  const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), value);
  if (ec != std::errc() || end != text.data() + text.size() || text.empty()) return std::nullopt;
  return value;
}

// One editable line of the base project and where it now sits in the JSON document.
struct Line {
  std::string name;
  std::string library_id;
  std::string pointer;  // JSON pointer of the line object; empty for a CSV line not yet written
  bool csv = false;
  int count = 1;
  bool removed = false;
};

bool is_line_pointer(const std::string& source) {
  for (const char* prefix : {"/bom/", "/plan/keep/", "/feed/supply_bom/"})
    if (source.rfind(prefix, 0) == 0) return true;
  return false;
}

class Editor {
 public:
  Editor(std::string_view text, const Project& base) : base_(base), root_(detail::parse_json_text(text, base.file)) {
    for (const PlacedPart& part : base.parts) {
      const bool csv = !base.bom_csv.empty() && part.source.rfind(base.bom_csv + ":", 0) == 0;
      if (!csv && !is_line_pointer(part.source)) continue;  // the feed itself
      lines_.push_back(Line{part.name, part.library_id, csv ? std::string() : part.source, csv, part.count, false});
    }
  }

  void apply(const ProjectEdit& edit) {
    switch (edit.kind) {
      case EditKind::add: {
        check_part(edit);
        if (edit.count < 1) fail_at(edit, "a count of at least 1 for a new line", std::to_string(edit.count));
        added_.push_back(Json{{"part", edit.part_id}, {"count", edit.count}});
        return;
      }
      case EditKind::replace: {
        check_part(edit);
        Line& line = resolve(edit);
        at(line)["part"] = edit.part_id;
        return;
      }
      case EditKind::count: {
        if (edit.count < 0) fail_at(edit, "a count of 0 or more (0 removes the line)", std::to_string(edit.count));
        Line& line = resolve(edit);
        if (edit.count == 0) line.removed = true;
        else at(line)["count"] = edit.count;
        return;
      }
      case EditKind::remove: resolve(edit).removed = true; return;
      case EditKind::mounting: {
        Json value;
        try {
          value = Json::parse(edit.mounting_json);
        } catch (const Json::exception&) {
          fail_at(edit, "a mounting inductance (e.g. 0.25n) or a mounting object", edit.mounting_json);
        }
        if (!value.is_string() && !value.is_number() && !value.is_object())
          fail_at(edit, "a mounting inductance (e.g. \"0.25n\") or a mounting object", detail::describe(value));
        at(resolve(edit))["mounting"] = value;
        return;
      }
    }
  }

  std::string finish() {
    // Removals last, highest index first within each list, so earlier pointers stay valid.
    std::map<std::string, std::vector<std::size_t>> removed;
    for (const Line& line : lines_) {
      if (!line.removed || line.pointer.empty()) continue;
      const auto slash = line.pointer.rfind('/');
      removed[line.pointer.substr(0, slash)].push_back(std::stoul(line.pointer.substr(slash + 1)));
    }
    for (auto& [list, indices] : removed) {
      std::sort(indices.rbegin(), indices.rend());
      Json& array = root_.at(Json::json_pointer(list));
      for (const std::size_t i : indices) array.erase(i);
    }
    if (!added_.empty()) {
      Json& bom = root_["bom"];
      if (bom.is_null()) bom = Json::array();
      for (auto& line : added_) bom.push_back(std::move(line));
    }
    return root_.dump(2);
  }

 private:
  const Project& base_;
  Json root_;
  std::vector<Line> lines_;
  std::vector<Json> added_;
  std::optional<PartLibrary> library_;
  bool csv_written_ = false;

  void check_part(const ProjectEdit& edit) {
    if (!library_) {
      std::vector<std::filesystem::path> paths(base_.libraries.begin(), base_.libraries.end());
      library_ = PartLibrary::from_files(paths);
    }
    if (library_->find(edit.part_id)) return;
    std::string near;
    for (const auto& n : library_->nearest(edit.part_id)) near.append(near.empty() ? "" : ", ").append(n);
    fail_at(edit, "a part id of the project's libraries",
            detail::quoted(edit.part_id) + (near.empty() ? std::string() : "; nearest: " + near));
  }

  Line& resolve(const ProjectEdit& edit) {
    Line* found = nullptr;
    for (Line& line : lines_)
      if (line.name == edit.target) found = &line;
    if (!found) {
      std::vector<Line*> by_id;
      for (Line& line : lines_)
        if (!line.library_id.empty() && line.library_id == edit.target) by_id.push_back(&line);
      if (by_id.size() > 1) {
        std::string names;
        for (const Line* l : by_id) names.append(names.empty() ? "" : ", ").append(l->name);
        fail_at(edit, "a branch name (the library id " + detail::quoted(edit.target) + " is used by several lines)",
                "lines " + names);
      }
      if (by_id.size() == 1) found = by_id.front();
    }
    if (!found) fail_at(edit, "the branch name or library id of a BOM line of the base project", unknown(edit.target));
    if (found->removed) fail_at(edit, "a line not removed by an earlier edit", detail::quoted(edit.target) + ", removed");
    if (found->csv) write_csv_lines();
    return *found;
  }

  std::string unknown(const std::string& name) const {
    std::vector<std::pair<std::size_t, std::string>> ranked;
    for (const Line& line : lines_) ranked.emplace_back(edit_distance(name, line.name), line.name);
    std::sort(ranked.begin(), ranked.end());
    std::string out = detail::quoted(name) + ", no such line";
    for (std::size_t i = 0; i < ranked.size() && i < 3; ++i) out.append(i == 0 ? "; nearest: " : ", ").append(ranked[i].second);
    return out;
  }

  // A CSV line cannot be edited in the CSV (inputs are never written): every CSV line is
  // written into `bom` as {part, count, name}, which the reader builds the same way (same
  // library part, project mounting rules, same name), and `bom_csv` is dropped.
  void write_csv_lines() {
    if (csv_written_) return;
    csv_written_ = true;
    Json& bom = root_["bom"];
    if (bom.is_null()) bom = Json::array();
    for (Line& line : lines_) {
      if (!line.csv) continue;
      bom.push_back(Json{{"part", line.library_id}, {"count", line.count}, {"name", line.name}});
      line.pointer = child("/bom", bom.size() - 1);
    }
    root_.erase("bom_csv");
  }

  Json& at(const Line& line) { return root_.at(Json::json_pointer(line.pointer)); }
};

}  // namespace

std::string_view to_string(EditKind kind) {
  switch (kind) {
    case EditKind::replace: return "replace";
    case EditKind::count: return "count";
    case EditKind::add: return "add";
    case EditKind::remove: return "remove";
    case EditKind::mounting: return "mounting";
  }
  return "replace";
}

ProjectEdit parse_edit_option(EditKind kind, std::string_view text, const std::string& option) {
  ProjectEdit edit;
  edit.kind = kind;
  edit.origin_file = kCommandLine;
  edit.origin_field = option;
  const std::string value = detail::trim_blanks(text);
  const auto bad = [&](const std::string& expected) { fail_at(edit, expected, detail::quoted(value)); };
  const auto count_of = [&](std::string_view digits, const std::string& expected) {
    const auto n = parse_count(detail::trim_blanks(digits));
    if (!n) bad(expected);
    return *n;
  };
  if (kind == EditKind::remove) {
    if (value.empty()) bad("NAME: a branch name or library id");
    edit.target = value;
    return edit;
  }
  if (kind == EditKind::add) {
    const auto colon = value.rfind(':');
    edit.part_id = detail::trim_blanks(value.substr(0, colon));
    if (colon != std::string::npos) edit.count = count_of(value.substr(colon + 1), "PART_ID:N with N a whole number");
    if (edit.part_id.empty()) bad("PART_ID or PART_ID:N");
    if (edit.count < 1) fail_at(edit, "a count of at least 1 for a new line", std::to_string(edit.count));
    return edit;
  }
  const auto eq = value.find('=');
  const char* form = kind == EditKind::replace ? "NAME=PART_ID" : kind == EditKind::count ? "NAME=N" : "NAME=VALUE";
  if (eq == std::string::npos) bad(form);
  edit.target = detail::trim_blanks(value.substr(0, eq));
  const std::string right = detail::trim_blanks(value.substr(eq + 1));
  if (edit.target.empty() || right.empty()) bad(form);
  if (kind == EditKind::replace) edit.part_id = right;
  else if (kind == EditKind::mounting) edit.mounting_json = Json(right).dump();
  else {
    edit.count = count_of(right, "NAME=N with N a whole number");
    if (edit.count < 0) fail_at(edit, "a count of 0 or more (0 removes the line)", std::to_string(edit.count));
  }
  return edit;
}

std::vector<ProjectEdit> parse_edits_json(std::string_view text, const std::string& file) {
  const Json root = detail::parse_json_text(text, file);
  const auto fail = [&](const std::string& pointer, const std::string& expected, const Json& found) {
    throw InputError({file, pointer}, expected, detail::describe(found));
  };
  if (!root.is_array()) fail("", "a list of edits (see docs/compare.md)", root);
  std::vector<ProjectEdit> edits;
  for (std::size_t i = 0; i < root.size(); ++i) {
    const std::string p = child("", i);
    const Json& entry = root[i];
    if (!entry.is_object()) fail(p, "an edit object such as {\"remove\": \"c100n\"}", entry);
    ProjectEdit edit;
    edit.origin_file = file;
    edit.origin_field = p;
    std::vector<std::string_view> kinds;
    for (const char* k : {"replace", "add", "remove", "mounting"})
      if (entry.contains(k)) kinds.push_back(k);
    if (kinds.empty() && entry.contains("count")) kinds.push_back("count");
    if (kinds.size() != 1)
      fail(p, "exactly one of the keys replace, count, add, remove, mounting", entry);
    const std::string_view kind = kinds.front();
    detail::Keys allowed;
    if (kind == "replace") allowed = {"replace", "with"};
    else if (kind == "count") allowed = {"count", "to"};
    else if (kind == "add") allowed = {"add", "count"};
    else if (kind == "remove") allowed = {"remove"};
    else allowed = {"mounting", "to"};
    for (const auto& [key, value] : entry.items())
      if (!detail::contains(allowed, key))
        throw InputError({file, child(p, key)}, "one of the keys " + detail::join(allowed) + " in a " +
                                                    std::string(kind) + " edit",
                         detail::quoted(key));
    const auto string_at = [&](std::string_view key, const std::string& expected) {
      const std::string kp = child(p, key);
      if (!entry.contains(key)) throw InputError({file, kp}, expected, "nothing: the key is missing");
      const Json& v = entry.at(std::string(key));
      if (!v.is_string() || v.get<std::string>().empty()) fail(kp, expected, v);
      return v.get<std::string>();
    };
    const auto count_at = [&](std::string_view key, int minimum, const std::string& expected) {
      const std::string kp = child(p, key);
      if (!entry.contains(key)) throw InputError({file, kp}, expected, "nothing: the key is missing");
      const Json& v = entry.at(std::string(key));
      if (!v.is_number_integer() || v.get<long long>() < minimum || v.get<long long>() > 1'000'000) fail(kp, expected, v);
      return static_cast<int>(v.get<long long>());
    };
    if (kind == "replace") {
      edit.kind = EditKind::replace;
      edit.target = string_at("replace", "the branch name or library id of the line to replace");
      edit.part_id = string_at("with", "the library id of the new part");
    } else if (kind == "count") {
      edit.kind = EditKind::count;
      edit.target = string_at("count", "the branch name or library id of the line");
      edit.count = count_at("to", 0, "a count of 0 or more (0 removes the line)");
    } else if (kind == "add") {
      edit.kind = EditKind::add;
      edit.part_id = string_at("add", "the library id of the part to add");
      edit.count = entry.contains("count") ? count_at("count", 1, "a count of at least 1 for a new line") : 1;
    } else if (kind == "remove") {
      edit.kind = EditKind::remove;
      edit.target = string_at("remove", "the branch name or library id of the line to remove");
    } else {
      edit.kind = EditKind::mounting;
      edit.target = string_at("mounting", "the branch name or library id of the line");
      const std::string tp = child(p, "to");
      if (!entry.contains("to")) throw InputError({file, tp}, "a mounting inductance", "nothing: the key is missing");
      const Json& v = entry.at("to");
      if (!v.is_string() && !v.is_number() && !v.is_object())
        fail(tp, "a mounting inductance (e.g. \"0.25n\") or a mounting object", v);
      edit.mounting_json = v.dump();
    }
    edits.push_back(std::move(edit));
  }
  return edits;
}

std::vector<ProjectEdit> read_edits_file(const std::filesystem::path& path) {
  return parse_edits_json(detail::read_text_file(path, "a readable edits file (JSON)"), path.string());
}

std::string apply_project_edits(std::string_view project_json, const Project& base,
                                const std::vector<ProjectEdit>& edits) {
  Editor editor(project_json, base);
  for (const ProjectEdit& edit : edits) editor.apply(edit);
  return editor.finish();
}

Project read_edited_project(const std::filesystem::path& path, const std::vector<ProjectEdit>& edits) {
  const std::string text = detail::read_text_file(path, "a readable project file (JSON)");
  const Project base = parse_project_json(text, path.string(), path.parent_path());
  const std::string edited = apply_project_edits(text, base, edits);
  return parse_project_json(edited, path.string() + " (edited)", path.parent_path());
}

}  // namespace quietrail
