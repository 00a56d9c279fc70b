#include "config/games.h"

#include <cstdint>
#include <unordered_map>

#include "config/suggest.h"

namespace standfast::config::detail {

namespace {

const std::string RUNS_RANGE = "a whole number from 0 to " + std::to_string(MAX_GAME_RUNS);

// Reads a whole number >= `min` from a field; reports and returns nullopt otherwise.
std::optional<int> field_int(const GameFields& g, const GameField& f, const char* name, int min,
                             const std::string& range, Report& report, int max = 1000000) {
  const auto v = parse_integer(f.text);
  if (!v) {
    report.error(f.pos, g.where + name + ": " + not_integer_message(f.text));
    return std::nullopt;
  }
  if (*v < min || *v > max) {
    report.error(f.pos, g.where + name + ": must be " + range + ", got " + std::to_string(*v));
    return std::nullopt;
  }
  return static_cast<int>(*v);
}

int team_field(const GameFields& g, const GameField& f, const char* name, const TeamIds& teams,
               Report& report) {
  if (!f.given) {
    report.error(g.pos, g.where + name + ": required");
    return -1;
  }
  const int t = teams.find(f.text);
  if (t < 0) {
    report.error(f.pos, g.where + name + ": unknown team " + quoted(f.text) +
                            did_you_mean(f.text, teams.ids));
  }
  return t;
}

// "games[3]: " for inline games, "" for CSV lines (their position says enough).
std::string head(const GameFields& g) {
  return g.where.empty() ? std::string() : g.where.substr(0, g.where.size() - 1) + ": ";
}

}  // namespace

void add_game(const GameFields& g, const TeamIds& teams, Season& season, Report& report) {
  const std::size_t errors_before = report.error_count();
  Game game;
  game.pos = g.pos;

  if (g.date.given && g.date.text != "tbd") {
    game.date = parse_date(g.date.text);
    if (!game.date) {
      report.error(g.date.pos, g.where + "date: cannot read " + quoted(g.date.text) +
                                   " as a date (YYYY-MM-DD, or tbd when not known)");
    }
  }
  game.home = team_field(g, g.home, "home", teams, report);
  game.away = team_field(g, g.away, "away", teams, report);
  if (game.home >= 0 && game.home == game.away) {
    report.error(g.away.pos, g.where + "away: team " + quoted(g.away.text) +
                                 " cannot play itself (home and away are the same)");
  }
  if (g.number.given) {
    if (const auto n = field_int(g, g.number, "game", 1, "at least 1", report)) game.number = *n;
  }

  // Status: empty/final, shortened, postponed.
  bool shortened = false;
  bool postponed = false;
  bool final_stated = false;
  if (g.status.given) {
    if (g.status.text == "final") {
      final_stated = true;
    } else if (g.status.text == "shortened") {
      shortened = true;
    } else if (g.status.text == "postponed") {
      postponed = true;
    } else {
      report.error(g.status.pos,
                   g.where + "status: unknown status " + quoted(g.status.text) +
                       ", expected final, shortened or postponed" +
                       did_you_mean(g.status.text, {"final", "shortened", "postponed"}));
    }
  }

  // Scores.
  std::optional<int> home_runs;
  std::optional<int> away_runs;
  if (g.home_runs.given) {
    home_runs = field_int(g, g.home_runs, "home_runs", 0, RUNS_RANGE, report, MAX_GAME_RUNS);
  }
  if (g.away_runs.given) {
    away_runs = field_int(g, g.away_runs, "away_runs", 0, RUNS_RANGE, report, MAX_GAME_RUNS);
  }
  const bool played = g.home_runs.given || g.away_runs.given;
  if (g.home_runs.given != g.away_runs.given) {
    const GameField& have = g.home_runs.given ? g.home_runs : g.away_runs;
    report.error(have.pos, head(g) + "only one score given (" +
                               (g.home_runs.given ? "home_runs" : "away_runs") + " " + have.text +
                               ", " + (g.home_runs.given ? "away_runs" : "home_runs") +
                               " missing): a played game needs both, a game not played neither");
  } else if (home_runs && away_runs && *home_runs == *away_runs) {
    report.error(g.away_runs.pos,
                 head(g) + "a played game cannot end tied (" + std::to_string(*home_runs) + "-" +
                     std::to_string(*away_runs) + "): extra innings go on until one side leads");
  }
  if (played && postponed) {
    report.error(g.status.pos, g.where + "status: a postponed game cannot have a score");
  }
  if (!played && (shortened || final_stated)) {
    report.error(g.status.pos, g.where + "status: " + g.status.text +
                                   " needs both scores (home_runs and away_runs)");
  }

  // Innings.
  if (g.innings.given) {
    if (const auto inn = field_int(g, g.innings, "innings", 1, "at least 1", report)) {
      const int regulation = season.league.regulation_innings;
      const int cap = season.league.extra_innings.max_innings;
      if (!played) {
        report.error(g.innings.pos, g.where + "innings: given for a game not played (no scores)");
      } else if (*inn < regulation && !shortened) {
        report.error(g.innings.pos,
                     g.where + "innings: " + std::to_string(*inn) + " is fewer than the " +
                         std::to_string(regulation) +
                         " of regulation; mark the game shortened if the officials ended it early");
      } else if (cap > 0 && *inn > cap) {
        report.error(g.innings.pos, g.where + "innings: " + std::to_string(*inn) +
                                        " is more than league.extra_innings.max_innings (" +
                                        std::to_string(cap) + ")");
      } else {
        game.innings = *inn;
      }
    }
  }

  if (report.error_count() != errors_before) return;
  game.played = played;
  game.home_runs = home_runs.value_or(0);
  game.away_runs = away_runs.value_or(0);
  game.shortened = shortened;
  game.postponed = postponed || !game.date;
  season.games.push_back(std::move(game));
}

namespace {

struct GameKey {
  DayNumber date;
  int home;
  int away;
  int number;
  bool operator==(const GameKey&) const = default;
};

struct GameKeyHash {
  std::size_t operator()(const GameKey& k) const {
    std::uint64_t h = static_cast<std::uint32_t>(k.date);
    h = h * 0x9E3779B97F4A7C15ULL + static_cast<std::uint32_t>(k.home);
    h = h * 0x9E3779B97F4A7C15ULL + static_cast<std::uint32_t>(k.away);
    h = h * 0x9E3779B97F4A7C15ULL + static_cast<std::uint32_t>(k.number);
    return static_cast<std::size_t>(h ^ (h >> 29));
  }
};

std::string where(const SourcePos& p) { return p.file + ":" + std::to_string(p.line); }

}  // namespace

void check_duplicate_games(const Season& season, const TeamIds& teams, Report& report) {
  std::unordered_map<GameKey, std::size_t, GameKeyHash> seen;
  seen.reserve(season.games.size());
  for (std::size_t i = 0; i < season.games.size(); ++i) {
    const Game& g = season.games[i];
    if (!g.date) continue;
    const auto [it, inserted] = seen.emplace(GameKey{*g.date, g.home, g.away, g.number}, i);
    if (!inserted) {
      const Game& first = season.games[it->second];
      report.error(g.pos, "the same game is listed twice (" + format_date(*g.date) + ", " +
                              teams.ids[static_cast<std::size_t>(g.away)] + " at " +
                              teams.ids[static_cast<std::size_t>(g.home)] + ", game " +
                              std::to_string(g.number) + "); first listed at " + where(first.pos));
    }
  }
}

}  // namespace standfast::config::detail
