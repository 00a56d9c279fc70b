// Tests of config/input_file.h: bounded reads of regular files and the text checks.
// References: RFC 3629 (Yergeau 2003), section 3 and 4: the well-formed UTF-8 byte sequences
// (no overlong forms such as C0 80, no surrogates ED A0..BF xx, nothing above F4 8F BF BF);
// The Unicode Standard 15.0, Table 3-7 "Well-Formed UTF-8 Byte Sequences" (the same ranges);
// YAML 1.2 (2009) section 5.1: a stream holds no C0 control character but tab, LF and CR.
#include <sys/stat.h>

#include <catch2/catch.hpp>
#include <filesystem>
#include <fstream>
#include <optional>
#include <string>

#include "config/input_file.h"

namespace fs = std::filesystem;
using standfast::config::check_text;
using standfast::config::read_input_file;

namespace {

fs::path fresh_dir(const std::string& name) {
  const fs::path dir = fs::path(STANDFAST_BINARY_DIR) / "config_input_file_test" / name;
  fs::remove_all(dir);
  fs::create_directories(dir);
  return dir;
}

// "LINE:COLUMN: message" of the first problem, or "" when the text is clean.
std::string problem(const std::string& text) {
  const auto d = check_text(text, "f");
  if (!d) return "";
  return std::to_string(d->pos.line) + ":" + std::to_string(d->pos.column) + ": " + d->message;
}

}  // namespace

TEST_CASE("well-formed UTF-8 passes") {
  // Ref: Unicode 15.0 Table 3-7: one row each: U+0041, U+00E9 (C3 A9), U+0800 (E0 A0 80),
  // U+D7FF (ED 9F BF), U+E000 (EE 80 80), U+10000 (F0 90 80 80), U+10FFFF (F4 8F BF BF).
  CHECK(problem("A\xC3\xA9\xE0\xA0\x80\xED\x9F\xBF\xEE\x80\x80\xF0\x90\x80\x80\xF4\x8F\xBF\xBF") ==
        "");
  CHECK(problem("\xEF\xBB\xBFteams:\n\tx\r\n") == "");  // a byte-order mark, tab, CRLF
  CHECK(problem("") == "");
}

TEST_CASE("ill-formed UTF-8 is reported at its byte") {
  // Ref: RFC 3629 section 3/4 and Unicode 15.0 Table 3-7 (each sequence below is outside it).
  CHECK(problem("ab\n c\x80") == "2:3: byte \\x80 is not valid UTF-8: save the file as UTF-8 text");
  CHECK(problem("\xC0\x80") == "1:1: byte \\xC0 is not valid UTF-8: save the file as UTF-8 text");
  CHECK(problem("\xC1\xBF") == "1:1: byte \\xC1 is not valid UTF-8: save the file as UTF-8 text");
  CHECK(problem("x\xE0\x9F\xBF") ==
        "1:2: byte \\xE0 is not valid UTF-8: save the file as UTF-8 text");
  CHECK(problem("\xED\xA0\x80") ==
        "1:1: byte \\xED is not valid UTF-8: save the file as UTF-8 text");
  CHECK(problem("\xF4\x90\x80\x80") ==
        "1:1: byte \\xF4 is not valid UTF-8: save the file as UTF-8 text");
  CHECK(problem("\xF5\x80\x80\x80") ==
        "1:1: byte \\xF5 is not valid UTF-8: save the file as UTF-8 text");
  CHECK(problem("\xE9t\xE9") == "1:1: byte \\xE9 is not valid UTF-8: save the file as UTF-8 text");
  CHECK(problem("ok \xC3") == "1:4: byte \\xC3 is not valid UTF-8: save the file as UTF-8 text");
}

TEST_CASE("NUL and control bytes are reported at their byte") {
  // Ref: YAML 1.2 section 5.1 (c-printable excludes C0 controls but tab, LF, CR, and DEL).
  CHECK(problem(std::string("a: b\nc\0", 7)) ==
        "2:2: a NUL byte (\\x00): the file must be text, not binary data");
  CHECK(problem("a\x1b[0m") ==
        "1:2: control character \\x1B is not allowed in the text (only tab and line breaks)");
  CHECK(problem("\x7f") ==
        "1:1: control character \\x7F is not allowed in the text (only tab and line breaks)");
}

TEST_CASE("only regular files within the limit are read") {
  const fs::path dir = fresh_dir("read");
  std::string why;
  { std::ofstream(dir / "small.txt") << "hello\n"; }
  CHECK(read_input_file((dir / "small.txt").string(), why) ==
        std::optional<std::string>("hello\n"));
  CHECK_FALSE(read_input_file((dir / "small.txt").string(), why, 5));
  CHECK(why == "is 6 bytes, more than the limit of 5 bytes");
  CHECK(read_input_file((dir / "small.txt").string(), why, 6) ==
        std::optional<std::string>("hello\n"));
  CHECK_FALSE(read_input_file(dir.string(), why));
  CHECK(why == "is a directory, not a regular file");
  CHECK_FALSE(read_input_file("/dev/zero", why));
  CHECK(why == "is a character device, not a regular file");
  const std::string fifo = (dir / "pipe").string();
  REQUIRE(::mkfifo(fifo.c_str(), 0600) == 0);
  CHECK_FALSE(read_input_file(fifo, why));  // returns at once: no writer is waited for
  CHECK(why == "is a FIFO (named pipe), not a regular file");
  CHECK_FALSE(read_input_file((dir / "absent").string(), why));
  CHECK(why == "No such file or directory");
}
