// Test support: running a shell command and capturing its standard output, and finding out
// whether the SciPy reference checks can run. Shared by the tests that call the built program
// or the Python reference scripts.
#ifndef STANDFAST_TESTS_PROCESS_SUPPORT_H
#define STANDFAST_TESTS_PROCESS_SUPPORT_H

#include <sys/wait.h>

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <map>
#include <sstream>
#include <string>

namespace standfast::testing {

struct ProcessResult {
  int status = -1;  // exit status, -1 when the command could not start or was killed
  std::string out;  // everything it wrote to standard output
};

// Runs `command` through the shell and captures its standard output.
inline ProcessResult run_process(const std::string& command) {
  ProcessResult r;
  FILE* pipe = ::popen(command.c_str(), "r");
  if (pipe == nullptr) return r;
  char buffer[4096];
  for (std::size_t n; (n = std::fread(buffer, 1, sizeof buffer, pipe)) > 0;)
    r.out.append(buffer, n);
  const int raw = ::pclose(pipe);
  r.status = WIFEXITED(raw) ? WEXITSTATUS(raw) : -1;
  return r;
}

// The standard output of `command`, or "" when it failed.
inline std::string run_command(const std::string& command) {
  ProcessResult r = run_process(command);
  return r.status == 0 ? r.out : std::string{};
}

// True when /usr/bin/python3 can import `module` (for example "scipy.stats").
inline bool have_python_module(const std::string& module) {
  if (!std::filesystem::exists("/usr/bin/python3")) return false;
  return run_command("/usr/bin/python3 -c 'import " + module + "; print(1)' 2>/dev/null") == "1\n";
}

// Parses the output of a reference script written as lines "key value" or "key index value"
// into a map keyed "key" or "key" + "index" (for example "offence3").
inline std::map<std::string, double> parse_reference_values(const std::string& text) {
  std::map<std::string, double> values;
  std::istringstream in(text);
  std::string line;
  while (std::getline(in, line)) {
    std::istringstream ls(line);
    std::string key, a, b;
    if (!(ls >> key >> a)) continue;
    if (ls >> b) {
      values[key + a] = std::stod(b);
    } else {
      values[key] = std::stod(a);
    }
  }
  return values;
}

// The whole content of a file (empty when it cannot be read).
inline std::string read_file(const std::filesystem::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

// An empty folder build/<test>/<name> for one test case's files.
inline std::filesystem::path fresh_dir(const std::string& test, const std::string& name) {
  const std::filesystem::path dir = std::filesystem::path(STANDFAST_BINARY_DIR) / test / name;
  std::filesystem::remove_all(dir);
  std::filesystem::create_directories(dir);
  return dir;
}

}  // namespace standfast::testing

#endif  // STANDFAST_TESTS_PROCESS_SUPPORT_H
