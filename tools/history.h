// The odds history: an embedded SQLite file that remembers each odds run by its league, season
// and as-of date (with the season file's content hash, model, seed and season count) and, per
// team, every chance with its standard error, the mean wins and the final-wins histogram.
// Movers and the chances through the season are read back from it. A thin wrapper over the
// SQLite C API; every write is one transaction, so an interrupted run leaves the file as it was.
#ifndef STANDFAST_TOOLS_HISTORY_H
#define STANDFAST_TOOLS_HISTORY_H

#include <cstdint>
#include <filesystem>
#include <functional>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "config/season.h"
#include "engine/simulate.h"

struct sqlite3;

namespace standfast::tools {

// Version of the history's tables, kept in the file (PRAGMA user_version). Raised on any
// incompatible change; a file of another version is refused with a clear message.
inline constexpr int HISTORY_SCHEMA_VERSION = 1;
// Marks a file as a standfast history (PRAGMA application_id; "SFHI" in ASCII).
inline constexpr std::int32_t HISTORY_APPLICATION_ID = 0x53464849;

// One team of a recorded run.
struct HistoryTeam {
  std::string id, name, division_id;
  int wins = 0, losses = 0, games_left = 0;  // as of the run's date
  engine::Probability division, postseason, bye, title;
  double mean_wins = 0;
  std::vector<std::uint64_t> wins_histogram;  // [w] = simulated seasons ending with w wins
};

// One recorded run. The key is (league, season_label, as_of, model, seed, seasons): recording a
// run with the same key replaces the earlier one.
struct HistoryRun {
  std::int64_t id = 0;  // row id, set when read back
  std::string league, season_label;
  config::DayNumber as_of = 0;
  std::string season_hash;  // content hash of the season file and its games (season_hash())
  std::string model;        // model_label() of the season's model section
  std::uint64_t seed = 0, seasons = 0;
  double max_se = 0;
  int games_played = 0;  // played games the run was fitted on
  std::vector<HistoryTeam> teams;
};

// The default history file, needing no set-up: $XDG_DATA_HOME/standfast/history.sqlite, or
// $HOME/.local/share/standfast/history.sqlite; its folder is created on first use.
std::filesystem::path default_history_path();

// 64-bit FNV-1a of the season file's bytes followed by a canonical line per game (so a games
// CSV beside the file counts too), as 16 hex digits.
std::string season_hash(const config::Season& season);

// A short text naming the model settings, e.g. "weibull shape=fit home_edge=1.04 shrink=20
// uncertainty=on".
std::string model_label(const config::ModelSpec& model);

class History {
 public:
  // Opens the file; creates it (and its folder) with the current schema when it does not exist
  // and `create` is true. Throws UsageError (exit 2) naming the file when it cannot be opened,
  // is not an SQLite file, is corrupt, belongs to another program or has another schema
  // version.
  static History open(const std::filesystem::path& file, bool create);

  History(History&&) noexcept;
  History& operator=(History&&) noexcept;
  ~History();

  // Records a run in one transaction, replacing the run with the same key. `after_team`, when
  // set, is called after each team's row is written, inside the transaction (tests use it to
  // interrupt a write).
  void record(const HistoryRun& run, const std::function<void(int teams_written)>& after_team = {});

  // Every recorded run of this league and season, the latest recorded per as-of date, in date
  // order, with their teams (in the order they were recorded).
  std::vector<HistoryRun> runs(const std::string& league, const std::string& season_label) const;

  // The latest recorded run of this league and season at this as-of date, if any.
  std::optional<HistoryRun> run_at(const std::string& league, const std::string& season_label,
                                   config::DayNumber as_of) const;

  const std::filesystem::path& file() const { return file_; }

 private:
  History(sqlite3* db, std::filesystem::path file);
  std::vector<HistoryTeam> teams_of(std::int64_t run_id) const;

  sqlite3* db_ = nullptr;
  std::filesystem::path file_;
};

}  // namespace standfast::tools

#endif  // STANDFAST_TOOLS_HISTORY_H
