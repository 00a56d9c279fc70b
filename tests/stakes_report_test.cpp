// Tests for tools/stakes_report.h, the games that matter, on the four-team log5 league of
// tests/tiny_league.h. Sources: exact enumeration of every outcome of the remaining games with
// one game's result fixed (tests/tiny_league.h, written independently of the engine; common
// practice); log5 (REFERENCE_VALUES.md section 5). Monte Carlo checks: fixed seed, 4 sigma.
#include "tools/stakes_report.h"

#include <algorithm>
#include <catch2/catch.hpp>
#include <cmath>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "engine/swing.h"
#include "tests/tiny_league.h"

using namespace standfast;
using namespace standfast::testing;
using namespace standfast::tools;

namespace {

engine::SwingResult run_swings(const engine::Plan& plan, const std::vector<std::uint32_t>& games) {
  engine::RunOptions opt;
  opt.seed = 9090;
  opt.seasons = 100000;
  opt.batch = 25000;
  return engine::simulate_swings(plan, games, opt);
}

std::vector<std::string> lines(const std::string& text) {
  std::vector<std::string> out;
  std::size_t at = 0;
  while (at < text.size()) {
    const std::size_t end = text.find('\n', at);
    out.push_back(text.substr(at, end - at));
    at = end == std::string::npos ? text.size() : end + 1;
  }
  return out;
}

std::size_t commas(const std::string& line) {
  return static_cast<std::size_t>(std::count(line.begin(), line.end(), ','));
}

}  // namespace

TEST_CASE("a team report ranks the team's games and matches exact enumeration") {
  const config::Season s = tiny_league();
  const engine::Plan plan = engine::compile_plan(s, neutral_ratings(s));
  const int team = 3;  // D: remaining games 1 (away at C), 3 (away at B), 4 (away at A), 7 (home)
  const auto games = engine::games_of_team(plan, team);
  const StakesReport r =
      make_stakes_report(s, plan, run_swings(plan, games), team, StakeChance::kPostseason);
  REQUIRE(r.games.size() == 4);
  double last = 1.0;
  for (const StakeGame& g : r.games) {
    const engine::TeamStake st = team_stake(r, g, StakeChance::kPostseason);
    CHECK(std::abs(st.difference) <= last);  // ranked, largest first
    last = std::abs(st.difference);
    // Which remaining game this is, by its teams and date (days 11..18 are games 0..7).
    const std::size_t k = static_cast<std::size_t>(*g.day - 20011);
    REQUIRE(LEFT[k][0] == g.home);
    REQUIRE(LEFT[k][1] == g.away);
    const bool home = g.home == team;
    std::vector<int> win(8, 0), lose(8, 0);
    win[k] = home ? 1 : -1;
    lose[k] = home ? -1 : 1;
    // Ref: exact enumeration of the 2^8 outcomes with game k's result fixed (tests/tiny_league.h;
    // common practice).
    const Exact ew = enumerate(LEFT, win), el = enumerate(LEFT, lose);
    INFO("game " << k << ": D's postseason if it wins " << st.if_wins << " (exact " << ew.post[3]
                 << "), if it loses " << st.if_loses << " (exact " << el.post[3] << ")");
    CHECK(std::abs(st.difference - (ew.post[3] - el.post[3])) <= 4 * st.se + 1e-12);
    // The win share of the team in the game: log5 of the two percentages (home edge 1).
    // Ref: log5, REFERENCE_VALUES.md section 5.
    const double p = log5(PCT[g.home], PCT[g.away]);
    CHECK(std::abs(g.home_win_share - p) <= 4 * std::sqrt(p * (1 - p) / 100000.0));
  }
  const std::string table = write_stakes_table(r);
  CHECK(table.find("Games that matter to D (D)") != std::string::npos);
  CHECK(table.find("not advice for wagering") != std::string::npos);
  CHECK(table.find("Run: standfast") != std::string::npos);

  const auto csv = lines(write_stakes_csv(r));
  REQUIRE(csv.size() == 5);
  CHECK(csv[0].rfind("rank,team_id,date,", 0) == 0);
  for (const auto& line : csv) CHECK(commas(line) == commas(csv[0]));
  const auto json = nlohmann::json::parse(write_stakes_json(r));
  CHECK(json["kind"] == "team");
  CHECK(json["team_id"] == "D");
  CHECK(json["games"].size() == 4);
  CHECK(json["games"][0]["rank"] == 1);
  CHECK(json["run"].is_object());
}

TEST_CASE("a league report ranks games by the chance that changes hands") {
  const config::Season s = tiny_league();
  const engine::Plan plan = engine::compile_plan(s, neutral_ratings(s));
  const auto games = engine::games_of_days(plan, 20011, 8);
  REQUIRE(games.size() == 8);
  StakesReport r =
      make_stakes_report(s, plan, run_swings(plan, games), -1, StakeChance::kPostseason);
  r.first_day = 20011;
  r.days = 8;
  REQUIRE(r.games.size() == 8);
  for (std::size_t i = 0; i < r.games.size(); ++i) {
    const StakeGame& g = r.games[i];
    if (i > 0) CHECK(g.postseason_total.moved <= r.games[i - 1].postseason_total.moved);
    const std::size_t k = static_cast<std::size_t>(*g.day - 20011);
    std::vector<int> home(8, 0), away(8, 0);
    home[k] = 1;
    away[k] = -1;
    // Ref: exact enumeration as above (tests/tiny_league.h; common practice).
    const Exact e1 = enumerate(LEFT, home), e0 = enumerate(LEFT, away);
    double exact = 0, bound = 0;
    for (std::size_t t = 0; t < 4; ++t) {
      exact += std::abs(e1.post[t] - e0.post[t]) / 2;
      bound += 4 * g.postseason[t].se / 2;
    }
    INFO("game " << k << " moved " << g.postseason_total.moved << " exact " << exact);
    CHECK(std::abs(g.postseason_total.moved - exact) <= bound + 1e-12);
  }
  const std::string table = write_stakes_table(r);
  CHECK(table.find("Games that matter in") != std::string::npos);
  CHECK(table.find("not advice for wagering") != std::string::npos);
  const auto csv = lines(write_stakes_csv(r));
  REQUIRE(csv.size() == 9);
  CHECK(csv[0].rfind("rank,date,game_number,home_id,away_id,home_win_share,", 0) == 0);
  for (const auto& line : csv) CHECK(commas(line) == commas(csv[0]));
  const auto json = nlohmann::json::parse(write_stakes_json(r));
  CHECK(json["kind"] == "league");
  CHECK(json["team_id"].is_null());
  CHECK(json["days"] == 8);
  CHECK(json["games"][0]["teams"].size() == 4);
}

TEST_CASE("a report with no game says so in every format") {
  const config::Season s = tiny_league();
  const engine::Plan plan = engine::compile_plan(s, neutral_ratings(s));
  StakesReport r = make_stakes_report(s, plan, run_swings(plan, {}), -1, StakeChance::kDivision);
  r.first_day = 20030;
  r.days = 3;
  CHECK(write_stakes_table(r).find("No remaining game is dated in these days") !=
        std::string::npos);
  CHECK(lines(write_stakes_csv(r)).size() == 1);
  CHECK(nlohmann::json::parse(write_stakes_json(r))["games"].empty());
}
