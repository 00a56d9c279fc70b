// Benchmark of the exact certainty computation (engine/certainty.h): every team's division,
// postseason, bye and title marks with its magic and elimination numbers, as `odds` and
// `standings` compute them once per call.
//
//   bench_certainty [--season FILE] [--runs N]
//
// Default season: scenarios/demo-late/season.yaml (the late-season demo league). Prints the
// fastest and the median time of N runs on one core, and how many marks were given.
#include <fmt/core.h>

#include <CLI/CLI.hpp>
#include <algorithm>
#include <chrono>
#include <exception>
#include <filesystem>
#include <string>
#include <vector>

#include "config/load.h"
#include "config/season.h"
#include "engine/certainty.h"
#include "engine/clinch.h"

int main(int argc, char** argv) {
  using namespace standfast;
  CLI::App app{"Benchmark of the exact clinch and elimination marks and magic numbers"};
  std::string season_file;
  int runs = 20;
  app.add_option("--season", season_file, "season file (default: the late-season demo)");
  app.add_option("--runs", runs, "timed runs")->check(CLI::Range(1, 100000));
  CLI11_PARSE(app, argc, argv);
  try {
    if (season_file.empty()) {
      for (const char* p :
           {"scenarios/demo-late/season.yaml", "../scenarios/demo-late/season.yaml"}) {
        if (std::filesystem::exists(p)) season_file = p;
      }
    }
    if (season_file.empty()) {
      fmt::print(stderr, "bench_certainty: no season file (give --season)\n");
      return 2;
    }
    const config::Season season = config::load_season(season_file);
    const auto records = engine::clinch_records(season);
    std::vector<double> ms;
    std::vector<engine::TeamCertainty> out;
    for (int i = 0; i < runs; ++i) {
      const auto start = std::chrono::steady_clock::now();
      out = engine::exact_certainty(season, records);
      ms.push_back(
          std::chrono::duration<double, std::milli>(std::chrono::steady_clock::now() - start)
              .count());
    }
    std::sort(ms.begin(), ms.end());
    int marks = 0, inexact = 0;
    for (const auto& t : out) {
      for (const auto* o : {&t.division, &t.berth}) {
        marks += o->mark != engine::Certainty::kOpen;
        inexact += !o->exact;
      }
    }
    fmt::print("{}: {} teams, {} division/postseason marks, {} answers at a search limit\n",
               season_file, out.size(), marks, inexact);
    fmt::print("exact certainty: fastest {:.2f} ms, median {:.2f} ms over {} runs (one core)\n",
               ms.front(), ms[ms.size() / 2], runs);
  } catch (const config::ConfigError& e) {
    fmt::print(stderr, "{}\n", e.what());
    return 2;
  } catch (const std::exception& e) {
    fmt::print(stderr, "bench_certainty: {}\n", e.what());
    return 1;
  }
  return 0;
}
