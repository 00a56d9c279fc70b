// Tests for engine/simulate.h: the whole season simulation.
// Sources:
//   Log5 / Bradley-Terry: REFERENCE_VALUES.md section 5 (Bill James, Baseball Abstract, 1981;
//     Bradley & Terry 1952, Biometrika 39, 324-345).
//   Best-of-n series: REFERENCE_VALUES.md section 4 (Mosteller 1952, JASA), recomputed with
//     Boost.Math 1.74 ibeta(m, m, p).
//   Exact enumeration of every outcome of a tiny league, written here independently of the
//     engine (no engine code is used to compute the expected values).
// Monte Carlo checks use a fixed seed and 4-sigma bounds (STYLE.md: at least 4 sigma, so a
// correct engine fails a single check with probability below 1e-4).
#include "engine/simulate.h"

#include <algorithm>
#include <array>
#include <barrier>
#include <boost/math/special_functions/beta.hpp>
#include <catch2/catch.hpp>
#include <cmath>
#include <numeric>
#include <thread>

#include "config/load.h"
#include "engine/game.h"
#include "models/ratings.h"

using namespace standfast;
using namespace standfast::engine;

namespace {

config::Game game(int day, int home, int away, int hr = -1, int ar = -1) {
  config::Game g;
  g.date = 20000 + day;
  g.home = home;
  g.away = away;
  if (hr >= 0) {
    g.played = true;
    g.home_runs = hr;
    g.away_runs = ar;
  }
  return g;
}

config::Team team(const std::string& id, int division, int conference, double rf = 1.0) {
  config::Team t;
  t.id = id;
  t.name = id;
  t.division = division;
  t.conference = conference;
  t.run_factor = rf;
  return t;
}

// Four teams A..D in one division of one conference; 8 games played (each team 4), 8 left (each
// team 4); one division winner and one at-large team meet in a best-of-3 final; ties broken by
// a random draw only; log5 model from win percentages .60, .45, .55, .40.
config::Season tiny_league() {
  config::Season s;
  s.file = "tiny.yaml";
  s.league.name = "Tiny";
  config::Group g;
  g.id = "L";
  g.teams = {0, 1, 2, 3};
  s.groups.push_back(g);
  s.conferences = {0};
  s.divisions = {0};
  for (const char* id : {"A", "B", "C", "D"}) s.teams.push_back(team(id, 0, 0));
  const int A = 0, B = 1, C = 2, D = 3;
  s.games = {game(1, A, B, 3, 1), game(2, C, D, 2, 4), game(3, A, C, 1, 5), game(4, B, D, 6, 2),
             game(5, A, D, 3, 2), game(6, B, C, 0, 1), game(7, B, A, 4, 2), game(8, D, C, 1, 3),
             game(11, A, B),      game(12, C, D),      game(13, A, C),      game(14, B, D),
             game(15, A, D),      game(16, B, C),      game(17, B, A),      game(18, D, C)};
  s.postseason.enabled = true;
  s.postseason.qualifying.push_back(config::Qualifying{0, 1, 1, 0, true});
  config::Round final_round;
  final_round.name = "Final";
  final_round.best_of = 3;
  final_round.higher_hosts = {true, false, true};
  s.postseason.rounds.push_back(final_round);
  s.model.family = config::ScoreFamily::kLog5;
  const double pct[4] = {0.60, 0.45, 0.55, 0.40};
  for (int t = 0; t < 4; ++t) {
    config::TeamOverride o;
    o.team = t;
    o.win_pct = pct[t];
    s.overrides.push_back(o);
  }
  return s;
}

models::LeagueRatings neutral_ratings(const config::Season& s, config::ScoreFamily family) {
  models::LeagueRatings r;
  r.family = family;
  r.league_mean = 4.5;
  r.shape = 1.83;
  r.home_edge = 1.0;
  r.teams.assign(s.teams.size(), models::TeamRating{});
  return r;
}

double log5(double pa, double pb) { return (pa - pa * pb) / (pa + pb - 2 * pa * pb); }

}  // namespace

TEST_CASE("tiny league: postseason and title chances match exact enumeration") {
  const config::Season season = tiny_league();
  const Plan plan = compile_plan(season, neutral_ratings(season, config::ScoreFamily::kLog5));
  REQUIRE(plan.remaining_games() == 8);

  // Ref: REFERENCE_VALUES.md section 5; log5(0.60, 0.40) = 9/13 = 0.69230769.
  REQUIRE(log5(0.60, 0.40) == Approx(9.0 / 13.0).epsilon(1e-12));

  // Exact enumeration: 2^8 outcomes of the remaining games; ties in wins broken by a uniformly
  // random order (all 4! priority orders equally likely); the top two meet in a best-of-3 whose
  // probability is I_p(2, 2) (home edge 1, so hosting does not matter).
  const double pct[4] = {0.60, 0.45, 0.55, 0.40};
  const int base_wins[4] = {2, 2, 3, 1};
  const int left[8][2] = {{0, 1}, {2, 3}, {0, 2}, {1, 3}, {0, 3}, {1, 2}, {1, 0}, {3, 2}};
  std::array<double, 4> exact_post{}, exact_title{};
  std::array<std::array<double, 9>, 4> exact_wins{};
  for (int mask = 0; mask < 256; ++mask) {
    double prob = 1;
    int wins[4] = {base_wins[0], base_wins[1], base_wins[2], base_wins[3]};
    for (int g = 0; g < 8; ++g) {
      const int h = left[g][0], a = left[g][1];
      const double ph = log5(pct[h], pct[a]);
      if (mask >> g & 1) {
        prob *= ph;
        ++wins[h];
      } else {
        prob *= 1 - ph;
        ++wins[a];
      }
    }
    for (int t = 0; t < 4; ++t) exact_wins[t][wins[t]] += prob;
    std::array<int, 4> prio = {0, 1, 2, 3};
    do {
      std::array<int, 4> order = {0, 1, 2, 3};
      std::sort(order.begin(), order.end(), [&](int x, int y) {
        return wins[x] != wins[y] ? wins[x] > wins[y] : prio[x] < prio[y];
      });
      const double w = prob / 24.0;
      const int a = order[0], b = order[1];
      exact_post[a] += w;
      exact_post[b] += w;
      // Ref: Boost.Math 1.74; ibeta(2, 2, p) = P(win a best-of-3) (REFERENCE_VALUES section 4).
      const double pa = boost::math::ibeta(2.0, 2.0, log5(pct[a], pct[b]));
      exact_title[a] += w * pa;
      exact_title[b] += w * (1 - pa);
    } while (std::next_permutation(prio.begin(), prio.end()));
  }

  RunOptions opt;
  opt.seed = 20261201;
  opt.seasons = 200000;
  opt.batch = 50000;
  const SimulationResult r = simulate(plan, opt);
  REQUIRE(r.seasons == 200000);
  REQUIRE(r.games_simulated == 8 * 200000);
  double sum_title = 0, sum_post = 0;
  for (int t = 0; t < 4; ++t) {
    const auto& o = r.teams[static_cast<std::size_t>(t)];
    const double n = 200000;
    INFO("team " << t << " postseason " << o.postseason.p << " exact " << exact_post[t] << " title "
                 << o.title.p << " exact " << exact_title[t]);
    const double se_post = std::sqrt(exact_post[t] * (1 - exact_post[t]) / n);
    const double se_title = std::sqrt(exact_title[t] * (1 - exact_title[t]) / n);
    CHECK(std::abs(o.postseason.p - exact_post[t]) <= 4 * se_post);
    CHECK(std::abs(o.title.p - exact_title[t]) <= 4 * se_title);
    CHECK(o.postseason.se == Approx(std::sqrt(o.postseason.p * (1 - o.postseason.p) / n)));
    for (int w = 0; w <= 8; ++w) {
      const double e = exact_wins[t][w];
      const double f = static_cast<double>(o.wins_histogram[static_cast<std::size_t>(w)]) / n;
      INFO("wins " << w << " freq " << f << " exact " << e);
      CHECK(std::abs(f - e) <= 4 * std::sqrt(e * (1 - e) / n) + 1e-12);
    }
    sum_title += o.title.p;
    sum_post += o.postseason.p;
    // Every team plays 8 games: wins + losses = 8 in every season.
    CHECK(o.mean_wins + o.mean_losses == Approx(8.0));
  }
  // Invariants: one title per season; two berths per season.
  CHECK(sum_title == Approx(1.0).epsilon(1e-12));
  CHECK(sum_post == Approx(2.0).epsilon(1e-12));
}

namespace {

// Twelve teams: two conferences of two divisions of three. One round-robin played (66 games,
// invented scores), two more left (132 games). Three qualifiers per conference (two division
// winners and one at-large, the top seed with a bye), conference final, league final; a
// Weibull model with uncertain strengths, a home edge, a venue factor, an override, tiebreak
// rules that read head-to-head, run differential and a last-games window.
config::Season twelve_teams(bool reseed = false) {
  config::Season s;
  s.file = "twelve.yaml";
  for (int c = 0; c < 2; ++c) {
    config::Group conf;
    conf.id = c ? "East" : "West";
    s.groups.push_back(conf);
  }
  s.conferences = {0, 1};
  for (int d = 0; d < 4; ++d) {
    config::Group div;
    div.id = "D";
    div.id += std::to_string(d);
    div.parent = d / 2;
    for (int k = 0; k < 3; ++k) div.teams.push_back(3 * d + k);
    s.groups[static_cast<std::size_t>(d / 2)].children.push_back(static_cast<int>(s.groups.size()));
    s.divisions.push_back(static_cast<int>(s.groups.size()));
    s.groups.push_back(div);
  }
  for (int t = 0; t < 12; ++t)
    s.teams.push_back(
        team(std::string("T").append(std::to_string(t)), 2 + t / 3, t / 6, t == 4 ? 1.08 : 1.0));
  int day = 1;
  for (int round = 0; round < 3; ++round)
    for (int i = 0; i < 12; ++i)
      for (int j = i + 1; j < 12; ++j) {
        const bool flip = (i + j + round) % 2;
        const int h = flip ? j : i, a = flip ? i : j;
        if (round == 0)
          s.games.push_back(game(day++, h, a, (i * 7 + j * 3) % 9,
                                 (i * 5 + j) % 8 + ((i + j) % 9 == (i * 5 + j) % 8 ? 1 : 0)));
        else
          s.games.push_back(game(day++, h, a));
      }
  for (auto& g : s.games)
    if (g.played && g.home_runs == g.away_runs) ++g.home_runs;
  s.postseason.enabled = true;
  s.postseason.reseed = reseed;
  s.postseason.qualifying.push_back(config::Qualifying{0, 2, 1, 1, true});
  s.postseason.qualifying.push_back(config::Qualifying{1, 2, 1, 1, true});
  const char* names[3] = {"Semifinal", "Conference final", "Final"};
  for (int r = 0; r < 3; ++r) {
    config::Round round;
    round.name = names[r];
    round.best_of = 2 * r + 3;
    for (int g = 0; g < round.best_of; ++g) round.higher_hosts.push_back(g % 2 == 0);
    s.postseason.rounds.push_back(round);
  }
  config::TiebreakRule h2h, rd, last;
  h2h.kind = config::TiebreakKind::kHeadToHead;
  rd.kind = config::TiebreakKind::kRunDifferential;
  last.kind = config::TiebreakKind::kLastGames;
  last.games = 5;
  last.scope = config::TiebreakScope::kDivision;
  s.tiebreakers.order = {h2h, last, rd};
  s.league.extra_innings.runner_on_second = true;
  config::TeamOverride o;
  o.team = 7;
  o.runs_allowed = 3.6;
  o.blend = 0.5;
  o.from = 20000 + 120;
  s.overrides.push_back(o);
  return s;
}

models::LeagueRatings twelve_ratings(const config::Season& s) {
  models::LeagueRatings r = neutral_ratings(s, config::ScoreFamily::kWeibull);
  r.home_edge = 1.04;
  for (std::size_t t = 0; t < r.teams.size(); ++t) {
    r.teams[t].offence = 0.85 + 0.03 * static_cast<double>(t);
    r.teams[t].defence = 1.12 - 0.02 * static_cast<double>(t);
    r.teams[t].log_offence_se = 0.06;
    r.teams[t].log_defence_se = 0.05;
  }
  return r;
}

void require_identical(const SimulationResult& a, const SimulationResult& b) {
  REQUIRE(a.seasons == b.seasons);
  REQUIRE(a.seed == b.seed);
  REQUIRE(a.max_se == b.max_se);
  REQUIRE(a.extra_innings_share == b.extra_innings_share);
  REQUIRE(a.games_simulated == b.games_simulated);
  REQUIRE(a.extra_innings_games == b.extra_innings_games);
  REQUIRE(a.drawn_games == b.drawn_games);
  REQUIRE(a.stopped_early == b.stopped_early);
  REQUIRE(a.round_names == b.round_names);
  REQUIRE(a.teams.size() == b.teams.size());
  auto same = [](const Probability& x, const Probability& y) { return x.p == y.p && x.se == y.se; };
  for (std::size_t t = 0; t < a.teams.size(); ++t) {
    const TeamOdds& x = a.teams[t];
    const TeamOdds& y = b.teams[t];
    REQUIRE(same(x.division, y.division));
    REQUIRE(same(x.postseason, y.postseason));
    REQUIRE(same(x.bye, y.bye));
    REQUIRE(same(x.title, y.title));
    REQUIRE(x.reached_round.size() == y.reached_round.size());
    for (std::size_t r = 0; r < x.reached_round.size(); ++r)
      REQUIRE(same(x.reached_round[r], y.reached_round[r]));
    REQUIRE(x.wins_histogram == y.wins_histogram);
    REQUIRE(x.seed_histogram == y.seed_histogram);
    REQUIRE(x.mean_wins == y.mean_wins);
    REQUIRE(x.mean_losses == y.mean_losses);
    REQUIRE(x.wins_p10 == y.wins_p10);
    REQUIRE(x.wins_p50 == y.wins_p50);
    REQUIRE(x.wins_p90 == y.wins_p90);
  }
}

}  // namespace

TEST_CASE("the same seed gives bit-identical results for 1, 2 and 8 threads") {
  const config::Season s = twelve_teams();
  const Plan plan = compile_plan(s, twelve_ratings(s));
  RunOptions opt;
  opt.seed = 99;
  opt.seasons = 6000;
  opt.batch = 2500;  // batches of 2500, 2500, 1000
  opt.threads = 1;
  const SimulationResult one = simulate(plan, opt);
  opt.threads = 2;
  const SimulationResult two = simulate(plan, opt);
  opt.threads = 8;
  const SimulationResult eight = simulate(plan, opt);
  REQUIRE(one.seasons == 6000);
  require_identical(one, two);
  require_identical(one, eight);
  // A different seed gives different numbers.
  opt.seed = 100;
  const SimulationResult other = simulate(plan, opt);
  bool differs = false;
  for (std::size_t t = 0; t < 12; ++t)
    differs = differs || other.teams[t].wins_histogram != one.teams[t].wins_histogram;
  CHECK(differs);
}

TEST_CASE("probabilities obey the league's invariants") {
  for (bool reseed : {false, true}) {
    const config::Season s = twelve_teams(reseed);
    const Plan plan = compile_plan(s, twelve_ratings(s));
    RunOptions opt;
    opt.seed = 5;
    opt.seasons = 20000;
    const SimulationResult r = simulate(plan, opt);
    REQUIRE(r.round_names == std::vector<std::string>{"Semifinal", "Conference final", "Final"});
    double title = 0;
    for (int d = 0; d < 4; ++d) {
      double div = 0;
      for (int k = 0; k < 3; ++k) div += r.teams[static_cast<std::size_t>(3 * d + k)].division.p;
      CHECK(div == Approx(1.0).epsilon(1e-12));  // one winner per division
    }
    for (int c = 0; c < 2; ++c) {
      double post = 0, bye = 0, final_round = 0;
      for (int k = 0; k < 6; ++k) {
        const TeamOdds& o = r.teams[static_cast<std::size_t>(6 * c + k)];
        post += o.postseason.p;
        bye += o.bye.p;
        final_round += o.reached_round[2].p;
        CHECK(o.reached_round[0].p == o.postseason.p);
        CHECK(o.reached_round[1].p <= o.reached_round[0].p);
        CHECK(o.title.p <= o.reached_round[2].p);
        std::uint64_t seeds = 0;
        for (auto c2 : o.seed_histogram) seeds += c2;
        CHECK(seeds == r.seasons);
        CHECK(o.mean_wins + o.mean_losses == Approx(33.0));  // three rounds of 11 games
        CHECK(o.wins_p10 <= o.wins_p50);
        CHECK(o.wins_p50 <= o.wins_p90);
      }
      CHECK(post == Approx(3.0).epsilon(1e-12));  // three berths per conference
      CHECK(bye == Approx(1.0).epsilon(1e-12));
      CHECK(final_round == Approx(1.0).epsilon(1e-12));  // one finalist per conference
      for (int k = 0; k < 6; ++k) title += r.teams[static_cast<std::size_t>(6 * c + k)].title.p;
    }
    CHECK(title == Approx(1.0).epsilon(1e-12));
    CHECK(r.games_simulated == 132u * 20000u);
    // Extra innings: the share of tied regulation scores is plausible (common practice, from
    // memory: about a tenth of games or fewer; a final-score model ties a little more often).
    CHECK(r.extra_innings_share > 0.05);
    CHECK(r.extra_innings_share < 0.15);
    CHECK(r.drawn_games == 0);
  }
}

TEST_CASE("early stop happens at a batch boundary, the same for any thread count") {
  const config::Season s = twelve_teams();
  const Plan plan = compile_plan(s, twelve_ratings(s));
  RunOptions opt;
  opt.seed = 11;
  opt.seasons = 1000000;
  opt.batch = 700;
  opt.target_se = 0.01;  // needs at least 2500 seasons (p = 0.5 worst case)
  std::vector<std::uint64_t> progress;
  opt.progress = [&](std::uint64_t done, std::uint64_t) { progress.push_back(done); };
  opt.threads = 1;
  const SimulationResult one = simulate(plan, opt);
  opt.threads = 2;
  const SimulationResult two = simulate(plan, opt);
  REQUIRE(one.stopped_early);
  CHECK(one.seasons % 700 == 0);
  CHECK(one.max_se < 0.01);
  CHECK(one.seasons >= 2500);
  require_identical(one, two);
  CHECK(progress.front() == 700);
  // Memory is flat: histograms have the league's sizes, not the number of seasons.
  CHECK(one.teams[0].wins_histogram.size() == 34);
  CHECK(one.teams[0].seed_histogram.size() == 4);
}

TEST_CASE("a run split over processes gives the single-process result, early stop included") {
  // Processes are emulated by threads that exchange their counts at every batch (what an MPI
  // all-reduce of integer sums does); the result must equal one process's, bit for bit.
  const config::Season s = twelve_teams();
  const Plan plan = compile_plan(s, twelve_ratings(s));
  RunOptions opt;
  opt.seed = 11;
  opt.seasons = 1000000;
  opt.batch = 700;
  opt.target_se = 0.01;
  const SimulationResult single = simulate(plan, opt);
  REQUIRE(single.stopped_early);
  for (int ranks : {2, 3}) {
    std::barrier sync(ranks);
    std::vector<std::vector<std::uint64_t>> slots(static_cast<std::size_t>(ranks));
    std::vector<SimulationResult> results(static_cast<std::size_t>(ranks));
    std::vector<std::thread> procs;
    for (int r = 0; r < ranks; ++r) {
      procs.emplace_back([&, r] {
        RunOptions o = opt;
        o.rank = r;
        o.ranks = ranks;
        o.combine = [&, r](std::vector<std::uint64_t>& counts) {
          slots[static_cast<std::size_t>(r)] = counts;
          sync.arrive_and_wait();
          std::fill(counts.begin(), counts.end(), 0);
          for (const auto& other : slots)
            for (std::size_t i = 0; i < counts.size(); ++i) counts[i] += other[i];
          sync.arrive_and_wait();
        };
        results[static_cast<std::size_t>(r)] = simulate(plan, o);
      });
    }
    for (auto& t : procs) t.join();
    for (const auto& r : results) require_identical(single, r);
  }
  RunOptions bad = opt;
  bad.ranks = 2;  // several ranks without a way to combine them
  CHECK_THROWS_AS(simulate(plan, bad), std::invalid_argument);
  bad.combine = [](std::vector<std::uint64_t>&) {};
  bad.rank = 2;
  CHECK_THROWS_AS(simulate(plan, bad), std::invalid_argument);
}

TEST_CASE("bad run options are refused") {
  const config::Season season = tiny_league();
  const Plan plan = compile_plan(season, neutral_ratings(season, config::ScoreFamily::kLog5));
  RunOptions opt;
  opt.batch = 0;
  CHECK_THROWS_AS(simulate(plan, opt), std::invalid_argument);
  opt.batch = 10;
  opt.threads = -1;
  CHECK_THROWS_AS(simulate(plan, opt), std::invalid_argument);
}

TEST_CASE("other families, a single bracket, extra tiebreak games and an innings cap") {
  struct Variant {
    config::ScoreFamily family;
    bool single;
    bool extra_game;
    int cap;
  };
  const Variant variants[] = {{config::ScoreFamily::kNegativeBinomial, false, true, 0},
                              {config::ScoreFamily::kPoisson, true, false, 11},
                              {config::ScoreFamily::kWeibull, true, true, 10}};
  for (const Variant& v : variants) {
    config::Season s = twelve_teams();
    s.model.family = v.family;
    if (v.single) s.postseason.format = config::BracketFormat::kSingleBracket;
    s.tiebreakers.extra_game = v.extra_game;
    s.league.extra_innings.max_innings = v.cap;
    models::LeagueRatings r = twelve_ratings(s);
    r.family = v.family;
    r.shape = v.family == config::ScoreFamily::kNegativeBinomial ? 8.0 : 1.83;
    const Plan plan = compile_plan(s, r);
    RunOptions opt;
    opt.seed = 21;
    opt.seasons = 4000;
    opt.threads = 1;
    const SimulationResult one = simulate(plan, opt);
    opt.threads = 2;
    require_identical(one, simulate(plan, opt));
    double post = 0, bye = 0, title = 0;
    for (const TeamOdds& o : one.teams) {
      post += o.postseason.p;
      bye += o.bye.p;
      title += o.title.p;
    }
    INFO("family " << static_cast<int>(v.family) << " single " << v.single);
    CHECK(post == Approx(6.0).epsilon(1e-12));
    CHECK(bye == Approx(2.0).epsilon(1e-12));
    CHECK(title == Approx(1.0).epsilon(1e-12));
    CHECK(one.extra_innings_share > 0.02);
    CHECK(one.extra_innings_share < 0.2);
    if (v.cap > 0)
      CHECK(one.drawn_games > 0);
    else
      CHECK(one.drawn_games == 0);
  }
}

TEST_CASE("regular-season ties and drawn games match closed forms of the stated laws") {
  // Every side has the league mean (4.5 runs, equal teams, no home edge, no venue factor, no
  // strength uncertainty), so every game is the same pair of discretised Weibull scores
  // (location -1/2, shape 1.83): P(tie) = sum_k P(k)^2 with P(score >= k) = exp(-(k/a)^1.83)
  // (REFERENCE_VALUES.md section 3's construction), a solving sum_{k>=1} exp(-(k/a)^g) = 4.5,
  // computed here by bisection independently of the engine's tables. With a 10-inning cap a
  // tied game is drawn when its one extra inning is tied: engine/game.h's stated law, closed
  // form as in tests/game_test.cpp, P = (1-s)^2 + s^2 (1-q)^2 / (1-q^2), s = 4.5/9 (1-q) 2.2.
  config::Season s = twelve_teams();
  s.overrides.clear();
  for (auto& t : s.teams) t.run_factor = 1.0;
  s.league.extra_innings.runner_on_second = true;
  s.league.extra_innings.max_innings = 10;
  const Plan plan = compile_plan(s, neutral_ratings(s, config::ScoreFamily::kWeibull));
  RunOptions opt;
  opt.seed = 5;
  opt.seasons = 30000;
  const SimulationResult r = simulate(plan, opt);

  const double g = 1.83, mean = 4.5;
  auto discrete_mean = [&](double a) {
    double sum = 0;
    for (int k = 1; k < 400; ++k) sum += std::exp(-std::pow(k / a, g));
    return sum;
  };
  double lo = 1, hi = 20;
  for (int i = 0; i < 200; ++i) {
    const double mid = 0.5 * (lo + hi);
    (discrete_mean(mid) < mean ? lo : hi) = mid;
  }
  const double a = 0.5 * (lo + hi);
  double p_tie = 0;
  for (int k = 0; k < 400; ++k) {
    const double pk =
        (k == 0 ? 1.0 : std::exp(-std::pow(k / a, g))) - std::exp(-std::pow((k + 1) / a, g));
    p_tie += pk * pk;
  }
  const double n = static_cast<double>(r.games_simulated);
  const double tie_share = static_cast<double>(r.extra_innings_games) / n;
  INFO("tie share " << tie_share << " expected " << p_tie);
  CHECK(std::abs(tie_share - p_tie) <= 4 * std::sqrt(p_tie * (1 - p_tie) / n));

  const double q = ExtraInnings::RUN_CONTINUATION;
  const double sc = mean / 9 * (1 - q) * ExtraInnings::RUNNER_FACTOR;
  const double p_draw = (1 - sc) * (1 - sc) + sc * sc * (1 - q) * (1 - q) / (1 - q * q);
  const double m = static_cast<double>(r.extra_innings_games);
  const double drawn_share = static_cast<double>(r.drawn_games) / m;
  INFO("drawn share of ties " << drawn_share << " expected " << p_draw);
  CHECK(std::abs(drawn_share - p_draw) <= 4 * std::sqrt(p_draw * (1 - p_draw) / m));
}

TEST_CASE("an override equal to the fitted rates leaves the odds within Monte Carlo noise") {
  // The demo league (invented data, used here only as a realistic league): one team's override
  // states the runs per game `standfast fit` prints for it (league mean x rating). The override
  // keeps the fitted strength's uncertainty, so the odds must agree with the plain run within
  // 3 standard errors of the difference (the bound; unpaired errors, the larger).
  const config::Season base =
      config::load_season(STANDFAST_SOURCE_DIR "/scenarios/demo/season.yaml");
  const models::LeagueRatings ratings = models::fit_ratings(base);
  RunOptions opt;
  opt.seed = 77;
  opt.seasons = 20000;
  const SimulationResult plain = simulate(compile_plan(base, ratings), opt);
  for (const int team : {0, 7}) {
    config::Season s = base;
    config::TeamOverride o;
    o.team = team;
    o.runs_scored = ratings.league_mean * ratings.teams[static_cast<std::size_t>(team)].offence;
    o.runs_allowed = ratings.league_mean * ratings.teams[static_cast<std::size_t>(team)].defence;
    s.overrides.push_back(o);
    const SimulationResult over = simulate(compile_plan(s, ratings), opt);
    const auto& a = plain.teams[static_cast<std::size_t>(team)];
    const auto& b = over.teams[static_cast<std::size_t>(team)];
    auto near = [](const Probability& x, const Probability& y) {
      return std::abs(x.p - y.p) <= 3 * std::hypot(x.se, y.se) + 1e-12;
    };
    INFO("team " << team << " postseason " << a.postseason.p << " -> " << b.postseason.p
                 << ", division " << a.division.p << " -> " << b.division.p);
    CHECK(near(a.postseason, b.postseason));
    CHECK(near(a.division, b.division));
    CHECK(near(a.bye, b.bye));
    CHECK(near(a.title, b.title));
    CHECK(std::abs(a.mean_wins - b.mean_wins) < 0.05);
  }
}

TEST_CASE("a stated uncertainty of zero fixes the team's strength") {
  // sd_runs: 0 removes the spread of the team's rate: its strength is the same every season,
  // so its final wins spread less than with the fitted uncertainty (10th to 90th percentile;
  // the game-to-game binomial spread alone remains). Invented demo league, fixed seed.
  const config::Season base =
      config::load_season(STANDFAST_SOURCE_DIR "/scenarios/demo/season.yaml");
  const models::LeagueRatings ratings = models::fit_ratings(base);
  config::Season s = base;
  config::TeamOverride o;
  o.team = 3;
  o.runs_scored = ratings.league_mean * ratings.teams[3].offence;
  o.runs_allowed = ratings.league_mean * ratings.teams[3].defence;
  o.sd_runs = 0.0;
  s.overrides.push_back(o);
  RunOptions opt;
  opt.seed = 78;
  opt.seasons = 10000;
  opt.postseason = false;
  const auto spread = [](const TeamOdds& t) { return t.wins_p90 - t.wins_p10; };
  const SimulationResult a = simulate(compile_plan(base, ratings), opt);
  const SimulationResult b = simulate(compile_plan(s, ratings), opt);
  INFO("spread " << spread(a.teams[3]) << " -> " << spread(b.teams[3]));
  CHECK(spread(b.teams[3]) < spread(a.teams[3]));
}
