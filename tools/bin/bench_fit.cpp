// Benchmark and recovery measurement of the scoring-model fit (models/).
//   bench_fit [SEASON_FILE] [--repeat N]
// Default file: scenarios/demo/season.yaml. Prints the wall time of fit_ratings (what the engine
// calls) and of fit_report (everything the `fit` command shows: three families, plain fit, free
// shapes, goodness of fit), the median of N runs (default 5). When truth.csv (team,offence,
// defence) sits beside the season file, also prints the root-mean-square error of the centred
// log ratings against the truth for the plain, adjusted (maximum likelihood) and adjusted +
// shrunk ratings.
#include <fmt/core.h>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <map>
#include <sstream>
#include <string>
#include <vector>

#include "config/load.h"
#include "models/fit_report.h"
#include "models/ratings.h"
#include "models/score_dist.h"

namespace {

double median(std::vector<double> v) {
  std::sort(v.begin(), v.end());
  return v[v.size() / 2];
}

template <class F>
double seconds(F&& f) {
  const auto t0 = std::chrono::steady_clock::now();
  f();
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
}

// RMSE between centred logs of estimates and truth.
double rmse(const std::vector<double>& est, const std::vector<double>& truth) {
  const size_t n = est.size();
  double me = 0, mt = 0;
  for (size_t i = 0; i < n; ++i) {
    me += std::log(est[i]) / n;
    mt += std::log(truth[i]) / n;
  }
  double s = 0;
  for (size_t i = 0; i < n; ++i) {
    const double d = (std::log(est[i]) - me) - (std::log(truth[i]) - mt);
    s += d * d;
  }
  return std::sqrt(s / n);
}

}  // namespace

int main(int argc, char** argv) {
  using namespace standfast;
  std::string file = "scenarios/demo/season.yaml";
  int repeat = 5;
  for (int i = 1; i < argc; ++i) {
    const std::string a = argv[i];
    if (a == "--repeat" && i + 1 < argc) {
      repeat = std::max(1, std::atoi(argv[++i]));
    } else {
      file = a;
    }
  }
  try {
    const config::Season season = config::load_season(file);
    int played = 0;
    for (const auto& g : season.games) played += g.played ? 1 : 0;
    fmt::print("{}: {} teams, {} played games, family {}\n", file, season.teams.size(), played,
               models::family_name(season.model.family));
    std::vector<double> t_ratings, t_report;
    models::FitReport rep;
    for (int r = 0; r < repeat; ++r) {
      t_ratings.push_back(seconds([&] { models::fit_ratings(season); }));
      t_report.push_back(seconds([&] { rep = models::fit_report(season); }));
    }
    fmt::print("fit_ratings (engine): median {:.3f} s over {} runs\n", median(t_ratings), repeat);
    fmt::print("fit_report (fit command, all diagnostics): median {:.3f} s\n", median(t_report));
    fmt::print("gamma {:.4f} +- {:.4f}, home edge {:.4f} +- {:.4f}, league mean {:.4f} +- {:.4f}\n",
               rep.ratings.shape, rep.ratings.shape_se, rep.ratings.home_edge,
               rep.ratings.home_edge_se, rep.ratings.league_mean, rep.ratings.league_mean_se);

    const auto truth_path = std::filesystem::path(file).parent_path() / "truth.csv";
    std::ifstream in(truth_path);
    if (!in) return 0;
    std::map<std::string, std::pair<double, double>> truth;
    std::string line;
    std::getline(in, line);  // header
    while (std::getline(in, line)) {
      if (line.empty() || line[0] == '#') continue;
      std::stringstream ls(line);
      std::string id, o, d;
      std::getline(ls, id, ',');
      std::getline(ls, o, ',');
      std::getline(ls, d, ',');
      truth[id] = {std::stod(o), std::stod(d)};
    }
    std::vector<double> to, td, po, pd, mo, md, so, sd;
    for (size_t i = 0; i < season.teams.size(); ++i) {
      const auto it = truth.find(season.teams[i].id);
      if (it == truth.end()) continue;
      const auto& t = rep.teams[i];
      to.push_back(it->second.first);
      td.push_back(it->second.second);
      po.push_back(t.plain_offence);
      pd.push_back(t.plain_defence);
      mo.push_back(t.mle_offence);
      md.push_back(t.mle_defence);
      so.push_back(t.offence);
      sd.push_back(t.defence);
    }
    fmt::print("recovery against {} ({} teams), RMSE of centred log ratings:\n",
               truth_path.string(), to.size());
    fmt::print("  {:<28} offence {:.4f}  defence {:.4f}\n", "plain", rmse(po, to), rmse(pd, td));
    fmt::print("  {:<28} offence {:.4f}  defence {:.4f}\n", "adjusted (max. likelihood)",
               rmse(mo, to), rmse(md, td));
    fmt::print("  {:<28} offence {:.4f}  defence {:.4f}\n",
               fmt::format("adjusted + shrunk ({:g} games)", season.model.shrink_games),
               rmse(so, to), rmse(sd, td));
  } catch (const std::exception& e) {
    fmt::print(stderr, "bench_fit: {}\n", e.what());
    return 2;
  }
  return 0;
}
