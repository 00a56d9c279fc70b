#include "tools/output.h"

#include <fcntl.h>
#include <fmt/core.h>
#include <sys/stat.h>
#include <unistd.h>

#include <array>
#include <cerrno>
#include <climits>
#include <csignal>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <filesystem>

#include "tools/commands.h"

namespace standfast::tools {

std::string group_digits(std::uint64_t n) {
  const std::string digits = fmt::format("{}", n);
  std::string out;
  const std::size_t len = digits.size();
  for (std::size_t i = 0; i < len; ++i) {
    if (i > 0 && (len - i) % 3 == 0) out += ',';
    out += digits[i];
  }
  return out;
}

namespace {

// The temporary file of the write in progress, removed by the signal handler. Only
// async-signal-safe calls are made in the handler: unlink and raise.
volatile std::sig_atomic_t temp_active = 0;
char temp_name[PATH_MAX + 1];

extern "C" void remove_temp_and_reraise(int sig) {
  if (temp_active) ::unlink(temp_name);
  // SA_RESETHAND restored the default action: the program ends as the signal intends.
  ::raise(sig);
}

// Installs the handler for SIGINT, SIGTERM and SIGHUP while it lives (signals the process
// ignores stay ignored), and removes it again.
class TempFileGuard {
 public:
  explicit TempFileGuard(const std::string& temp) {
    if (temp.size() > PATH_MAX) return;
    std::memcpy(temp_name, temp.c_str(), temp.size() + 1);
    struct sigaction act {};
    act.sa_handler = remove_temp_and_reraise;
    sigemptyset(&act.sa_mask);
    act.sa_flags = SA_RESETHAND;
    for (std::size_t i = 0; i < SIGNALS.size(); ++i) {
      struct sigaction old {};
      ::sigaction(SIGNALS[i], nullptr, &old);
      installed_[i] = old.sa_handler != SIG_IGN && ::sigaction(SIGNALS[i], &act, &old_[i]) == 0;
    }
    temp_active = 1;
  }
  ~TempFileGuard() {
    temp_active = 0;
    for (std::size_t i = 0; i < SIGNALS.size(); ++i) {
      if (installed_[i]) ::sigaction(SIGNALS[i], &old_[i], nullptr);
    }
  }
  void disarm() { temp_active = 0; }
  TempFileGuard(const TempFileGuard&) = delete;
  TempFileGuard& operator=(const TempFileGuard&) = delete;

 private:
  static constexpr std::array<int, 3> SIGNALS = {SIGINT, SIGTERM, SIGHUP};
  std::array<struct sigaction, 3> old_{};
  std::array<bool, 3> installed_{};
};

[[noreturn]] void fail(const std::string& path, const std::string& what, int err) {
  throw UsageError(fmt::format("{}: {}: {}", path, what, std::strerror(err)));
}

const char* kind_of(mode_t mode) {
  if (S_ISDIR(mode)) return "a directory";
  if (S_ISFIFO(mode)) return "a FIFO (named pipe)";
  if (S_ISCHR(mode)) return "a character device";
  if (S_ISBLK(mode)) return "a block device";
  if (S_ISSOCK(mode)) return "a socket";
  return "not a regular file";
}

// Refuses a target that exists and is not a regular file; returns whether it exists.
bool check_target(const std::string& path, struct stat& st) {
  if (::lstat(path.c_str(), &st) != 0) {
    if (errno == ENOENT) return false;
    fail(path, "cannot write", errno);
  }
  if (S_ISLNK(st.st_mode)) {
    throw UsageError(fmt::format(
        "{}: is a symbolic link; output replaces only regular files (name the file itself)", path));
  }
  if (!S_ISREG(st.st_mode)) {
    throw UsageError(
        fmt::format("{}: is {}, not a regular file; output replaces only regular files", path,
                    kind_of(st.st_mode)));
  }
  return true;
}

std::string folder_of(const std::string& path) {
  const std::string dir = std::filesystem::path(path).parent_path().string();
  return dir.empty() ? std::string(".") : dir;
}

void write_stdout(std::string_view content) {
  std::size_t done = 0;
  while (done < content.size()) {
    const std::size_t n = std::fwrite(content.data() + done, 1, content.size() - done, stdout);
    if (n == 0) break;
    done += n;
  }
  if (std::fflush(stdout) != 0 || done < content.size() || std::ferror(stdout)) {
    const int err = errno;
    std::clearerr(stdout);
    fail("standard output", "write failed", err);
  }
}

}  // namespace

void check_output_target(const std::string& path, const std::vector<std::string>& inputs) {
  if (path.empty() || path == "-") return;
  struct stat st {};
  const bool exists = check_target(path, st);
  if (exists) {
    for (const std::string& input : inputs) {
      struct stat in {};
      if (::stat(input.c_str(), &in) == 0 && in.st_dev == st.st_dev && in.st_ino == st.st_ino) {
        throw UsageError(fmt::format(
            "{}: is the input file {}; the output would overwrite it (choose another file)", path,
            input));
      }
    }
  }
  const std::string dir = folder_of(path);
  struct stat ds {};
  if (::stat(dir.c_str(), &ds) != 0)
    fail(path, fmt::format("cannot write in folder {}", dir), errno);
  if (!S_ISDIR(ds.st_mode)) {
    throw UsageError(fmt::format("{}: cannot write: {} is not a folder", path, dir));
  }
  if (::access(dir.c_str(), W_OK | X_OK) != 0) {
    fail(path, fmt::format("cannot write in folder {}", dir), errno);
  }
}

namespace detail {

void write_file(const std::string& path, std::string_view content,
                const std::function<void()>& before_rename) {
  struct stat st {};
  const bool exists = check_target(path, st);
  mode_t mode = 0;
  if (exists) {
    mode = st.st_mode & 07777;
  } else {
    const mode_t mask = ::umask(0);
    ::umask(mask);
    mode = 0666 & ~mask;
  }
  // A short fixed-length name, so that any legal target name has a legal temporary name.
  std::string temp = (std::filesystem::path(folder_of(path)) / ".standfast-XXXXXX").string();
  const int fd = ::mkostemp(temp.data(), O_CLOEXEC);
  if (fd < 0) fail(path, "cannot create a temporary file beside it", errno);
  TempFileGuard guard(temp);
  const auto give_up = [&](const char* what, int err) {
    ::close(fd);
    ::unlink(temp.c_str());
    fail(path, what, err);
  };
  std::size_t done = 0;
  while (done < content.size()) {
    const ssize_t n = ::write(fd, content.data() + done, content.size() - done);
    if (n < 0 && errno == EINTR) continue;
    if (n <= 0) give_up("write failed", n < 0 ? errno : EIO);
    done += static_cast<std::size_t>(n);
  }
  if (::fchmod(fd, mode) != 0) give_up("cannot set the file mode", errno);
  if (::fsync(fd) != 0) give_up("cannot flush to disk", errno);
  if (::close(fd) != 0) {
    const int err = errno;
    ::unlink(temp.c_str());
    fail(path, "write failed", err);
  }
  if (before_rename) before_rename();
  if (::rename(temp.c_str(), path.c_str()) != 0) {
    const int err = errno;
    ::unlink(temp.c_str());
    fail(path, "cannot write", err);
  }
  guard.disarm();
  // The rename itself is on disk once the folder is flushed.
  const int dir = ::open(folder_of(path).c_str(), O_RDONLY | O_DIRECTORY | O_CLOEXEC);
  if (dir >= 0) {
    ::fsync(dir);
    ::close(dir);
  }
}

}  // namespace detail

void write_output(const std::string& path, std::string_view content) {
  if (path.empty() || path == "-") {
    write_stdout(content);
    return;
  }
  detail::write_file(path, content, {});
}

Format parse_format(const std::string& name) {
  if (name == "table") return Format::kTable;
  if (name == "csv") return Format::kCsv;
  if (name == "json") return Format::kJson;
  throw UsageError(fmt::format("--format: expected table, csv or json, got '{}'", name));
}

std::string csv_field(std::string_view text) {
  if (text.find_first_of(",\"\r\n") == std::string_view::npos) return std::string{text};
  std::string out = "\"";
  for (char c : text) {
    if (c == '"') out += '"';
    out += c;
  }
  out += '"';
  return out;
}

}  // namespace standfast::tools
