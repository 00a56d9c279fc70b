// Tests for tools/odds_report.h: the table, CSV and JSON writers against a hand-built
// SimulationResult of an invented four-team league.
// References: Monte Carlo standard error SE = sqrt(p(1-p)/N) (REFERENCE_VALUES.md section 8;
// python3 -c "import math; print(math.sqrt(.25*.75/1e4))" -> 0.004330127018922193); CSV quoting
// by RFC 4180 section 2 (fields holding commas or quotes are quoted, quotes doubled); JSON parsed
// back with nlohmann-json (3.11, Debian 12).
#include "tools/odds_report.h"

#include <catch2/catch.hpp>
#include <cmath>
#include <nlohmann/json.hpp>
#include <sstream>
#include <string>
#include <vector>

#include "tools/commands.h"

using standfast::config::Group;
using standfast::config::Qualifying;
using standfast::config::Season;
using standfast::config::Team;
using standfast::engine::Certainty;
using standfast::engine::ClinchMarks;
using standfast::engine::ClinchRecord;
using standfast::engine::Probability;
using standfast::engine::SimulationResult;
using standfast::engine::TeamOdds;
namespace tools = standfast::tools;

namespace {

constexpr std::uint64_t N = 10000;

Probability prob(double p) { return {p, std::sqrt(p * (1 - p) / static_cast<double>(N))}; }

// One conference ("north", Northern Loop) with divisions "north-a" {T0, T1} and "north-b"
// {T2, T3}; 1 division winner each, no at-large, 1 bye; rounds "Semifinal" and "Final".
Season make_season() {
  Season s;
  s.league.name = "Invented Coastal Loop";
  s.league.season_label = "Year 3";
  Group conf;
  conf.id = "north";
  conf.name = "Northern Loop";
  conf.children = {1, 2};
  s.groups.push_back(conf);
  const char* names[] = {"Quarry Larks", "Saltmarsh Owls", "Ridge, Tern & Co", "Fen Herons"};
  const char* ids[] = {"QLK", "SOW", "RTC", "FHE"};
  for (int d = 0; d < 2; ++d) {
    Group g;
    g.id = d == 0 ? "north-a" : "north-b";
    g.name = d == 0 ? "Upper Division" : "Lower Division";
    g.parent = 0;
    g.teams = {2 * d, 2 * d + 1};
    s.groups.push_back(g);
    s.divisions.push_back(1 + d);
  }
  s.conferences = {0};
  for (int t = 0; t < 4; ++t) {
    Team team;
    team.id = ids[t];
    team.name = names[t];
    team.division = 1 + t / 2;
    team.conference = 0;
    s.teams.push_back(team);
  }
  Qualifying q;
  q.conference = 0;
  q.division_winners = 2;
  q.at_large = 0;
  q.byes = 1;
  s.postseason.qualifying = {q};
  s.postseason.enabled = true;
  return s;
}

SimulationResult make_result() {
  SimulationResult r;
  r.seed = 777;
  r.seasons = N;
  r.round_names = {"Semifinal", "Final"};
  r.max_se = 0.005;
  r.extra_innings_share = 0.087;
  r.games_simulated = 40 * N;
  r.extra_innings_games = 34800;
  const double division[] = {1.0, 0.0, 0.25, 0.75};
  const double berth[] = {1.0, 0.0, 0.25, 0.75};
  const double bye[] = {0.9996, 0.0, 0.0004, 0.612};
  const double title[] = {0.5, 0.0, 0.00049, 0.49951};
  for (int t = 0; t < 4; ++t) {
    TeamOdds o;
    o.division = prob(division[t]);
    o.postseason = prob(berth[t]);
    o.bye = prob(bye[t]);
    o.title = prob(title[t]);
    o.reached_round = {prob(berth[t]), prob(title[t] * 1.5)};
    o.wins_histogram = std::vector<std::uint64_t>(31, 0);
    o.wins_histogram[10 + t] = N / 2;
    o.wins_histogram[12 + t] = N / 2;
    o.seed_histogram = {0, 0, 0};
    o.mean_wins = 11.5 + t;
    o.mean_losses = 18.5 - t;
    o.wins_p10 = 10 + t;
    o.wins_p50 = 11 + t;
    o.wins_p90 = 12 + t;
    r.teams.push_back(o);
  }
  return r;
}

// Records: T0 20-5 (5 left), T1 8-17, T2 12-13, T3 14-11. Marks: T0 clinched the division and
// a berth, T1 eliminated from both; T2 and T3 open.
tools::OddsReport make_report(const std::string& group = {}) {
  const Season s = make_season();
  const std::vector<ClinchRecord> records = {{20, 5, 5}, {8, 17, 5}, {12, 13, 5}, {14, 11, 5}};
  std::vector<ClinchMarks> marks(4);
  marks[0] = {Certainty::kClinched, Certainty::kClinched};
  marks[1] = {Certainty::kEliminated, Certainty::kEliminated};
  return tools::make_odds_report(s, make_result(), records, marks, 0.0, group);
}

std::vector<std::string> lines_of(const std::string& text) {
  std::vector<std::string> out;
  std::istringstream in(text);
  for (std::string line; std::getline(in, line);) out.push_back(line);
  return out;
}

}  // namespace

TEST_CASE("chances are rounded without showing 0% or 100% unless certain") {
  using tools::format_chance;
  CHECK(format_chance(0.612, Certainty::kOpen) == "61.2%");
  CHECK(format_chance(0.00049, Certainty::kOpen) == "<0.1%");
  CHECK(format_chance(0.9996, Certainty::kOpen) == ">99.9%");
  CHECK(format_chance(0.0, Certainty::kOpen) == "0%*");
  CHECK(format_chance(1.0, Certainty::kOpen) == "100%*");
  CHECK(format_chance(1.0, Certainty::kClinched) == "clinched");
  CHECK(format_chance(0.0, Certainty::kEliminated) == "eliminated");
  CHECK(format_chance(0.0006, Certainty::kOpen) == "0.1%");
  CHECK(format_chance(0.9984, Certainty::kOpen) == "99.8%");
}

TEST_CASE("the table states the caution, the run and the marks") {
  const std::string table = tools::write_odds_table(make_report());
  const auto lines = lines_of(table);
  REQUIRE(lines.size() > 6);
  CHECK(lines[0] == "Invented Coastal Loop, Year 3: odds from 10,000 simulated seasons");
  CHECK(lines[1] == std::string(tools::ODDS_CAUTION));
  CHECK(lines[1].find("not advice for wagering") != std::string::npos);
  CHECK(lines[1].find("model estimates") != std::string::npos);
  CHECK(lines[2].rfind("Run: standfast ", 0) == 0);
  CHECK(lines[2].find("seed 777; 10,000 seasons") != std::string::npos);
  CHECK(lines[3].find("Largest standard error 0.50 percentage points") != std::string::npos);
  CHECK(lines[3].find("extra innings in 8.7%") != std::string::npos);
  CHECK(table.find("Northern Loop - Upper Division") != std::string::npos);
  CHECK(table.find("Northern Loop - Lower Division") != std::string::npos);
  CHECK(table.find("clinched") != std::string::npos);
  CHECK(table.find("eliminated") != std::string::npos);

  // Fen Herons (14-11) lead Ridge, Tern & Co (12-13) in the lower division.
  const auto herons = table.find("Fen Herons");
  const auto terns = table.find("Ridge, Tern & Co");
  REQUIRE(herons != std::string::npos);
  REQUIRE(terns != std::string::npos);
  CHECK(herons < terns);

  // The Fen Herons line: record, games left, projected record (14.5 wins of 30 decided games
  // rounds to 15-15, wins and losses adding up), range 13-15, chances.
  std::string herons_line;
  for (const auto& l : lines) {
    if (l.rfind("Fen Herons", 0) == 0) herons_line = l;
  }
  std::istringstream cells(herons_line.substr(std::string("Fen Herons").size()));
  std::vector<std::string> words;
  for (std::string w; cells >> w;) words.push_back(w);
  const std::vector<std::string> expected = {"14-11", "5",     "15-15", "13-15",
                                             "75.0%", "75.0%", "61.2%", "50.0%"};
  CHECK(words == expected);
}

TEST_CASE("eliminated from a berth means no bye and no title either") {
  const std::string table = tools::write_odds_table(make_report());
  std::string owls;
  for (const auto& l : lines_of(table)) {
    if (l.rfind("Saltmarsh Owls", 0) == 0) owls = l;
  }
  std::istringstream cells(owls.substr(std::string("Saltmarsh Owls").size()));
  std::vector<std::string> words;
  for (std::string w; cells >> w;) words.push_back(w);
  REQUIRE(words.size() == 8);
  CHECK(words[4] == "eliminated");
  CHECK(words[5] == "eliminated");
  CHECK(words[6] == "eliminated");
  CHECK(words[7] == "eliminated");
}

TEST_CASE("CSV has one documented row per team, quoted where needed") {
  const std::string csv = tools::write_odds_csv(make_report());
  const auto lines = lines_of(csv);
  REQUIRE(lines.size() == 5);
  CHECK(lines[0] ==
        "team_id,team_name,conference,division,wins,losses,games_left,mean_wins,mean_losses,"
        "wins_p10,wins_p50,wins_p90,division_p,division_se,division_status,division_magic,"
        "division_elimination,postseason_p,postseason_se,postseason_status,postseason_magic,"
        "postseason_elimination,bye_p,bye_se,bye_status,title_p,title_se,title_status,round1_p,"
        "round1_se,round2_p,round2_se" +
            tools::provenance_csv_header());
  // Table order: upper division (QLK 20-5, SOW 8-17), lower (FHE 14-11, RTC 12-13).
  CHECK(lines[1].rfind("QLK,Quarry Larks,north,north-a,20,5,5,11.500,18.500,10,11,12,", 0) == 0);
  CHECK(lines[3].rfind("FHE,", 0) == 0);
  // RFC 4180: the name with a comma is quoted.
  CHECK(lines[4].rfind("RTC,\"Ridge, Tern & Co\",north,north-b,12,13,5,", 0) == 0);
  // Ref: REFERENCE_VALUES.md section 8; sqrt(0.25*0.75/1e4) = 0.00433013 -> "0.004330".
  CHECK(lines[4].find(",0.250000,0.004330,,") != std::string::npos);
  CHECK(lines[1].find(",1.000000,0.000000,clinched,") != std::string::npos);
  CHECK(lines[2].find(",0.000000,0.000000,eliminated,") != std::string::npos);
}

TEST_CASE("JSON carries the schema version, the run and every team field") {
  const auto doc = nlohmann::json::parse(tools::write_odds_json(make_report()));
  CHECK(doc["schema_version"] == 1);
  CHECK(doc["caution"].get<std::string>() == std::string(tools::ODDS_CAUTION));
  const auto& run = doc["run"];
  CHECK(run["league"] == "Invented Coastal Loop");
  CHECK(run["season"] == "Year 3");
  CHECK(run["seed"] == 777);
  CHECK(run["seasons"] == N);
  CHECK(run["max_se"] == 0.005);
  CHECK(run["stopped_early"] == false);
  CHECK(run["postseason"] == true);
  CHECK(run["rounds"] == nlohmann::json::array({"Semifinal", "Final"}));
  REQUIRE(doc["teams"].size() == 4);
  const auto& rtc = doc["teams"][3];
  CHECK(rtc["team_id"] == "RTC");
  CHECK(rtc["team_name"] == "Ridge, Tern & Co");
  CHECK(rtc["conference"] == "north");
  CHECK(rtc["division"] == "north-b");
  CHECK(rtc["record"]["wins"] == 12);
  CHECK(rtc["record"]["losses"] == 13);
  CHECK(rtc["record"]["games_left"] == 5);
  CHECK(rtc["projected"]["mean_wins"] == 13.5);
  CHECK(rtc["projected"]["wins_p90"] == 14.0);
  CHECK(rtc["division_title"]["p"] == 0.25);
  // Ref: REFERENCE_VALUES.md section 8: p = 0.25, N = 1e4 -> 0.00433013.
  CHECK(rtc["division_title"]["se"].get<double>() == Approx(0.00433013).epsilon(1e-6));
  CHECK(rtc["division_title"]["status"] == "");
  CHECK(rtc["postseason"]["p"] == 0.25);
  CHECK(rtc["bye"]["p"] == 0.0004);
  CHECK(rtc["title"]["p"] == 0.00049);
  REQUIRE(rtc["reached_round"].size() == 2);
  CHECK(rtc["reached_round"][0]["name"] == "Semifinal");
  CHECK(rtc["reached_round"][0]["p"] == 0.25);
  CHECK(rtc["seed_histogram"] == nlohmann::json::array({0, 0, 0}));
  CHECK(rtc["wins_histogram"]["first"] == 12);
  CHECK(rtc["wins_histogram"]["counts"] == nlohmann::json::array({N / 2, 0, N / 2}));
  CHECK(doc["teams"][0]["division_title"]["status"] == "clinched");
  CHECK(doc["teams"][1]["postseason"]["status"] == "eliminated");
}

TEST_CASE("a group filter keeps one division; an unknown id is a usage error") {
  const auto report = make_report("north-b");
  REQUIRE(report.teams.size() == 2);
  CHECK(report.divisions.size() == 1);
  CHECK(lines_of(tools::write_odds_csv(report)).size() == 3);
  CHECK(make_report("north").teams.size() == 4);
  CHECK_THROWS_AS(make_report("south"), tools::UsageError);
}

TEST_CASE("without a postseason only the division columns are written") {
  Season s = make_season();
  s.postseason.enabled = false;
  SimulationResult r = make_result();
  r.round_names.clear();
  const std::vector<ClinchRecord> records(4);
  const std::vector<ClinchMarks> marks(4);
  const auto report = tools::make_odds_report(s, r, records, marks, 0.0);
  const auto csv = lines_of(tools::write_odds_csv(report));
  CHECK(csv[0].find("postseason") == std::string::npos);
  CHECK(tools::write_odds_table(report).find("Title") == std::string::npos);
  const auto doc = nlohmann::json::parse(tools::write_odds_json(report));
  CHECK_FALSE(doc["teams"][0].contains("postseason"));
}

TEST_CASE("exact certainty: marks, magic and elimination numbers in every format") {
  // Invented marks and numbers (the computation itself is tested in certainty_test.cpp): only
  // how they are written is checked here.
  tools::OddsReport report = make_report();
  std::vector<standfast::engine::TeamCertainty> c(4);
  c[0].division = {Certainty::kClinched, 0, -1, true};
  c[0].berth = {Certainty::kClinched, 0, -1, true};
  c[0].bye = Certainty::kClinched;
  c[1].division = {Certainty::kEliminated, -1, 0, true};
  c[1].berth = {Certainty::kEliminated, -1, 0, true};
  c[1].bye = c[1].title = Certainty::kEliminated;
  c[2].division = {Certainty::kOpen, 3, 7, true};
  c[2].berth = {Certainty::kOpen, -1, 4, true};
  c[3].division = {Certainty::kEliminated, -1, 0, true};  // the exact marks replace the given
  tools::attach_certainty(report, c);
  CHECK(report.certainty);
  CHECK(report.teams[3].marks.division == Certainty::kEliminated);

  const std::string table = tools::write_odds_table(report);
  CHECK(table.find("Div M/E") != std::string::npos);
  CHECK(table.find("Post M/E") != std::string::npos);
  CHECK(table.find("M/E: magic number") != std::string::npos);
  const auto rows = lines_of(table);
  const auto row_of = [&](const std::string& name) {
    for (const auto& l : rows) {
      if (l.rfind(name, 0) == 0) return l;
    }
    return std::string();
  };
  const std::string rtc = row_of("Ridge, Tern & Co");
  CHECK(rtc.find("3/7") != std::string::npos);
  CHECK(rtc.find("-/4") != std::string::npos);

  const auto csv = lines_of(tools::write_odds_csv(report));
  // RTC (team 2): division open, magic 3, elimination 7; postseason magic none, elimination 4.
  CHECK(csv[4].find(",0.250000,0.004330,,3,7,") != std::string::npos);
  CHECK(csv[4].find(",,,4,") != std::string::npos);
  CHECK(csv[1].find(",clinched,0,,") != std::string::npos);  // QLK: clinched, magic 0
  CHECK(csv[1].find(",clinched,") != std::string::npos);

  const auto doc = nlohmann::json::parse(tools::write_odds_json(report));
  const auto& t = doc["teams"][3];  // RTC
  CHECK(t["division_title"]["magic_number"] == 3);
  CHECK(t["division_title"]["elimination_number"] == 7);
  CHECK(t["division_title"]["proof_complete"] == true);
  CHECK(t["postseason"]["magic_number"].is_null());
  CHECK(t["postseason"]["elimination_number"] == 4);
  CHECK(doc["teams"][0]["bye"]["status"] == "clinched");
  CHECK(doc["teams"][1]["title"]["status"] == "eliminated");
  CHECK(doc["teams"][1]["bye"]["status"] == "eliminated");
}
