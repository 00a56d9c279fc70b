#include "config/input_file.h"

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

#include <cerrno>
#include <cstdio>
#include <cstring>

namespace standfast::config {

namespace {

const char* kind_of(mode_t mode) {
  if (S_ISDIR(mode)) return "a directory";
  if (S_ISFIFO(mode)) return "a FIFO (named pipe)";
  if (S_ISCHR(mode)) return "a character device";
  if (S_ISBLK(mode)) return "a block device";
  if (S_ISSOCK(mode)) return "a socket";
  return "not a regular file";
}

// Closes the descriptor on every path out.
struct Fd {
  int fd;
  ~Fd() {
    if (fd >= 0) ::close(fd);
  }
};

std::string hex_byte(unsigned char c) {
  char buf[8];
  std::snprintf(buf, sizeof buf, "\\x%02X", c);
  return buf;
}

// Length of the valid UTF-8 sequence at text[i], or 0 when it is not valid (RFC 3629:
// no overlong forms, no surrogates, nothing above U+10FFFF).
std::size_t utf8_length(std::string_view text, std::size_t i) {
  const auto b = [&](std::size_t k) { return static_cast<unsigned char>(text[i + k]); };
  const unsigned char c = b(0);
  std::size_t n = 0;
  unsigned char lo = 0x80, hi = 0xBF;  // range of the second byte
  if (c >= 0xC2 && c <= 0xDF) {
    n = 2;
  } else if (c >= 0xE0 && c <= 0xEF) {
    n = 3;
    if (c == 0xE0) lo = 0xA0;
    if (c == 0xED) hi = 0x9F;
  } else if (c >= 0xF0 && c <= 0xF4) {
    n = 4;
    if (c == 0xF0) lo = 0x90;
    if (c == 0xF4) hi = 0x8F;
  } else {
    return 0;
  }
  if (i + n > text.size()) return 0;
  if (b(1) < lo || b(1) > hi) return 0;
  for (std::size_t k = 2; k < n; ++k) {
    if (b(k) < 0x80 || b(k) > 0xBF) return 0;
  }
  return n;
}

}  // namespace

std::optional<std::string> read_input_file(const std::string& path, std::string& why,
                                           std::uint64_t max_bytes) {
  // O_NONBLOCK: opening a FIFO with no writer must not wait; the type is checked right after.
  Fd f{::open(path.c_str(), O_RDONLY | O_NONBLOCK | O_NOCTTY | O_CLOEXEC)};
  if (f.fd < 0) {
    why = std::strerror(errno);
    return std::nullopt;
  }
  struct stat st {};
  if (::fstat(f.fd, &st) != 0) {
    why = std::strerror(errno);
    return std::nullopt;
  }
  if (!S_ISREG(st.st_mode)) {
    why = std::string("is ") + kind_of(st.st_mode) + ", not a regular file";
    return std::nullopt;
  }
  if (static_cast<std::uint64_t>(st.st_size) > max_bytes) {
    why = "is " + std::to_string(st.st_size) + " bytes, more than the limit of " +
          std::to_string(max_bytes) + " bytes";
    return std::nullopt;
  }
  std::string text;
  text.resize(static_cast<std::size_t>(st.st_size));
  std::size_t have = 0;
  for (;;) {
    if (have == text.size()) {
      // The file may have grown since fstat: read on, but never past the limit.
      if (have > max_bytes) {
        why = "grew past the limit of " + std::to_string(max_bytes) + " bytes while being read";
        return std::nullopt;
      }
      text.resize(have + 4096 <= max_bytes + 1 ? have + 4096 : max_bytes + 1);
    }
    const ssize_t n = ::read(f.fd, text.data() + have, text.size() - have);
    if (n < 0 && errno == EINTR) continue;
    if (n < 0) {
      why = std::string("read error: ") + std::strerror(errno);
      return std::nullopt;
    }
    if (n == 0) break;
    have += static_cast<std::size_t>(n);
  }
  if (have > max_bytes) {
    why = "grew past the limit of " + std::to_string(max_bytes) + " bytes while being read";
    return std::nullopt;
  }
  text.resize(have);
  return text;
}

std::optional<Diagnostic> check_text(std::string_view text, const std::string& file) {
  int line = 1;
  std::size_t line_start = 0;
  for (std::size_t i = 0; i < text.size();) {
    const auto c = static_cast<unsigned char>(text[i]);
    const auto where = [&] { return SourcePos{file, line, static_cast<int>(i - line_start + 1)}; };
    if (c == '\n') {
      ++line;
      line_start = ++i;
      continue;
    }
    if (c < 0x80) {
      if (c == 0) {
        return Diagnostic{where(), "a NUL byte (\\x00): the file must be text, not binary data"};
      }
      if ((c < 0x20 && c != '\t' && c != '\r') || c == 0x7F) {
        return Diagnostic{where(), "control character " + hex_byte(c) +
                                       " is not allowed in the text (only tab and line breaks)"};
      }
      ++i;
      continue;
    }
    const std::size_t n = utf8_length(text, i);
    if (n == 0) {
      return Diagnostic{where(),
                        "byte " + hex_byte(c) + " is not valid UTF-8: save the file as UTF-8 text"};
    }
    i += n;
  }
  return std::nullopt;
}

}  // namespace standfast::config
