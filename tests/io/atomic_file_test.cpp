// SPDX-License-Identifier: MIT
// All-or-nothing output files and the refusal to overwrite an input.
// Behaviour tests of the documented contract in io/atomic_file.hpp; no physical values are
// involved, each expected outcome is derived from that contract by inspection.
#include <catch2/catch.hpp>

#include <filesystem>
#include <string>
#include <vector>

#include "quietrail/error.hpp"
#include "quietrail/io/atomic_file.hpp"
#include "support/temp_dir.hpp"

namespace fs = std::filesystem;
using Catch::Matchers::Contains;
using quietrail::check_not_an_input;
using quietrail::InputError;
using quietrail::write_file_atomically;
using quietrail::test::list_names;
using quietrail::test::read_text;
using quietrail::test::TempDir;
using quietrail::test::write_text;

TEST_CASE("an atomic write leaves exactly the new file and no temporary", "[io]") {
  TempDir dir("atomic");
  const fs::path out = dir / "curve.csv";
  write_file_atomically(out, "a,b\n1,2\n");
  CHECK(read_text(out) == "a,b\n1,2\n");
  CHECK(list_names(dir.path()) == std::vector<std::string>{"curve.csv"});

  SECTION("writing again replaces the old contents") {
    write_file_atomically(out, "new\n");
    CHECK(read_text(out) == "new\n");
    CHECK(list_names(dir.path()) == std::vector<std::string>{"curve.csv"});
  }
  SECTION("an empty file is a valid result") {
    write_file_atomically(out, "");
    CHECK(fs::file_size(out) == 0);
  }
}

TEST_CASE("an output that is one of the run's inputs is refused and the input is untouched", "[io]") {
  TempDir dir("atomic");
  const fs::path input = dir / "rail.json";
  write_text(input, "{}");
  const std::vector<fs::path> inputs{input};

  SECTION("the same path") {
    CHECK_THROWS_AS(write_file_atomically(input, "x", inputs), InputError);
  }
  SECTION("the same file through '..'") {
    fs::create_directory(dir / "sub");
    CHECK_THROWS_AS(write_file_atomically(dir.path() / "sub" / ".." / "rail.json", "x", inputs), InputError);
  }
  SECTION("the same file through a symbolic link") {
    fs::create_symlink(input, dir / "link.json");
    CHECK_THROWS_AS(write_file_atomically(dir / "link.json", "x", inputs), InputError);
  }
  SECTION("the same file through a hard link") {
    fs::create_hard_link(input, dir / "hard.json");
    CHECK_THROWS_AS(write_file_atomically(dir / "hard.json", "x", inputs), InputError);
  }
  SECTION("an output whose temporary name is the input") {
    CHECK_THROWS_AS(write_file_atomically(dir / "rail", "x", {dir / "rail.tmp"}), InputError);
  }
  CHECK(read_text(input) == "{}");
}

TEST_CASE("the refusal names the output and the input it would have overwritten", "[io]") {
  TempDir dir("atomic");
  const fs::path input = dir / "rail.json";
  write_text(input, "{}");
  try {
    check_not_an_input(input, {dir / "other.json", input});
    FAIL("no exception");
  } catch (const InputError& e) {
    CHECK(e.where().file == input.string());
    CHECK(e.where().field == "output");
    CHECK_THAT(e.what(), Contains("not one of this run's inputs"));
  }
  CHECK_NOTHROW(check_not_an_input(dir / "out.csv", {input}));
}

TEST_CASE("a failed write removes its temporary file and keeps what was there", "[io]") {
  TempDir dir("atomic");
  SECTION("a missing directory fails before anything is created") {
    CHECK_THROWS_WITH(write_file_atomically(dir / "no-such-dir" / "out.csv", "x"), Contains("out.csv"));
    CHECK(list_names(dir.path()).empty());
  }
  SECTION("renaming onto a directory fails after the write; the temporary is removed") {
    fs::create_directory(dir / "taken");
    write_text(dir / "taken" / "keep.txt", "keep");
    CHECK_THROWS_AS(write_file_atomically(dir / "taken", "x"), InputError);
    CHECK(list_names(dir.path()) == std::vector<std::string>{"taken"});
    CHECK(read_text(dir / "taken" / "keep.txt") == "keep");
  }
}

TEST_CASE("a stale temporary that is a symbolic link is replaced, not written through", "[io]") {
  TempDir dir("atomic");
  write_text(dir / "victim.txt", "victim");
  fs::create_symlink(dir / "victim.txt", dir / "out.csv.tmp");
  write_file_atomically(dir / "out.csv", "data");
  CHECK(read_text(dir / "victim.txt") == "victim");
  CHECK(read_text(dir / "out.csv") == "data");
  CHECK(list_names(dir.path()) == std::vector<std::string>{"out.csv", "victim.txt"});
}
