#include "tools/history.h"

#include <fmt/core.h>
#include <sqlite3.h>

#include <cstdlib>
#include <stdexcept>
#include <system_error>
#include <utility>

#include "tools/commands.h"

namespace standfast::tools {
namespace {

namespace fs = std::filesystem;

// Problems with the file itself (not a database, corrupt, unreadable, disk full) are bad input,
// exit status 2; anything else (a malformed statement) is a bug.
[[noreturn]] void fail(sqlite3* db, const fs::path& file, int code, const std::string& what) {
  const std::string message = fmt::format("{}: {}: {}", file.string(), what,
                                          db ? sqlite3_errmsg(db) : sqlite3_errstr(code));
  switch (code & 0xff) {
    case SQLITE_NOTADB:
    case SQLITE_CORRUPT:
      throw UsageError(message + " (the file is not a valid standfast history)");
    case SQLITE_CANTOPEN:
    case SQLITE_READONLY:
    case SQLITE_PERM:
    case SQLITE_FULL:
    case SQLITE_IOERR:
    case SQLITE_BUSY:
    case SQLITE_LOCKED:
      throw UsageError(message);
    default:
      throw std::runtime_error(message);
  }
}

// A prepared statement, finalised on scope exit.
class Statement {
 public:
  Statement(sqlite3* db, const fs::path& file, const char* sql) : db_(db), file_(file) {
    const int rc = sqlite3_prepare_v2(db, sql, -1, &stmt_, nullptr);
    if (rc != SQLITE_OK) fail(db_, file_, rc, "cannot read");
  }
  Statement(const Statement&) = delete;
  Statement& operator=(const Statement&) = delete;
  ~Statement() { sqlite3_finalize(stmt_); }

  Statement& bind(int i, const std::string& text) {
    check(
        sqlite3_bind_text(stmt_, i, text.data(), static_cast<int>(text.size()), SQLITE_TRANSIENT));
    return *this;
  }
  Statement& bind(int i, std::int64_t v) {
    check(sqlite3_bind_int64(stmt_, i, v));
    return *this;
  }
  Statement& bind(int i, double v) {
    check(sqlite3_bind_double(stmt_, i, v));
    return *this;
  }
  // Ready to run again with new values.
  Statement& reset() {
    sqlite3_reset(stmt_);
    sqlite3_clear_bindings(stmt_);
    return *this;
  }
  // True while a row is available.
  bool step() {
    const int rc = sqlite3_step(stmt_);
    if (rc == SQLITE_ROW) return true;
    if (rc == SQLITE_DONE) return false;
    fail(db_, file_, rc, "cannot read or write");
  }
  void run() {
    while (step()) {
    }
  }
  std::int64_t integer(int col) const { return sqlite3_column_int64(stmt_, col); }
  double real(int col) const { return sqlite3_column_double(stmt_, col); }
  std::string text(int col) const {
    const auto* p = sqlite3_column_text(stmt_, col);
    return p ? std::string(reinterpret_cast<const char*>(p)) : std::string{};
  }

 private:
  void check(int rc) {
    if (rc != SQLITE_OK) fail(db_, file_, rc, "cannot bind a value");
  }
  sqlite3* db_;
  const fs::path& file_;
  sqlite3_stmt* stmt_ = nullptr;
};

void exec(sqlite3* db, const fs::path& file, const char* sql) {
  const int rc = sqlite3_exec(db, sql, nullptr, nullptr, nullptr);
  if (rc != SQLITE_OK) fail(db, file, rc, "cannot read or write");
}

std::int64_t pragma_int(sqlite3* db, const fs::path& file, const char* sql) {
  Statement s(db, file, sql);
  return s.step() ? s.integer(0) : 0;
}

constexpr const char* SCHEMA = R"sql(
CREATE TABLE run (
  id INTEGER PRIMARY KEY,
  league TEXT NOT NULL,
  season_label TEXT NOT NULL,
  as_of TEXT NOT NULL,
  season_hash TEXT NOT NULL,
  model TEXT NOT NULL,
  seed INTEGER NOT NULL,
  seasons INTEGER NOT NULL,
  max_se REAL NOT NULL,
  games_played INTEGER NOT NULL,
  UNIQUE (league, season_label, as_of, model, seed, seasons)
);
CREATE TABLE team_odds (
  run_id INTEGER NOT NULL REFERENCES run (id),
  position INTEGER NOT NULL,
  team TEXT NOT NULL,
  name TEXT NOT NULL,
  division TEXT NOT NULL,
  wins INTEGER NOT NULL,
  losses INTEGER NOT NULL,
  games_left INTEGER NOT NULL,
  division_p REAL NOT NULL, division_se REAL NOT NULL,
  postseason_p REAL NOT NULL, postseason_se REAL NOT NULL,
  bye_p REAL NOT NULL, bye_se REAL NOT NULL,
  title_p REAL NOT NULL, title_se REAL NOT NULL,
  mean_wins REAL NOT NULL,
  wins_histogram TEXT NOT NULL,
  PRIMARY KEY (run_id, team)
);
)sql";

std::string join_counts(const std::vector<std::uint64_t>& counts) {
  std::string out;
  for (std::size_t i = 0; i < counts.size(); ++i) {
    if (i) out += ',';
    out += fmt::format("{}", counts[i]);
  }
  return out;
}

std::vector<std::uint64_t> split_counts(const std::string& text) {
  std::vector<std::uint64_t> counts;
  std::size_t start = 0;
  while (start < text.size()) {
    std::size_t end = text.find(',', start);
    if (end == std::string::npos) end = text.size();
    counts.push_back(std::strtoull(text.substr(start, end - start).c_str(), nullptr, 10));
    start = end + 1;
  }
  return counts;
}

std::uint64_t fnv1a(std::uint64_t h, std::string_view bytes) {
  for (unsigned char c : bytes) {
    h ^= c;
    h *= 0x100000001b3ULL;
  }
  return h;
}

}  // namespace

fs::path default_history_path() {
  if (const char* xdg = std::getenv("XDG_DATA_HOME"); xdg && *xdg) {
    return fs::path(xdg) / "standfast" / "history.sqlite";
  }
  const char* home = std::getenv("HOME");
  return fs::path(home && *home ? home : ".") / ".local" / "share" / "standfast" / "history.sqlite";
}

std::string season_hash(const config::Season& season) {
  std::uint64_t h = 0xcbf29ce484222325ULL;  // FNV-1a 64 offset basis
  std::string bytes;
  if (FILE* f = std::fopen(season.file.c_str(), "rb")) {
    char buf[8192];
    for (std::size_t n; (n = std::fread(buf, 1, sizeof buf, f)) > 0;) h = fnv1a(h, {buf, n});
    std::fclose(f);
  }
  for (const config::Game& g : season.games) {
    const std::string line = fmt::format(
        "{}|{}|{}|{}|{}|{}|{}|{}|{}|{}\n", g.date ? config::format_date(*g.date) : "tbd",
        season.teams[static_cast<std::size_t>(g.home)].id,
        season.teams[static_cast<std::size_t>(g.away)].id, g.number, g.played, g.home_runs,
        g.away_runs, g.innings, g.shortened, g.postponed);
    h = fnv1a(h, line);
  }
  return fmt::format("{:016x}", h);
}

std::string model_label(const config::ModelSpec& m) {
  const char* family = "weibull";
  switch (m.family) {
    case config::ScoreFamily::kWeibull:
      break;
    case config::ScoreFamily::kNegativeBinomial:
      family = "negative_binomial";
      break;
    case config::ScoreFamily::kPoisson:
      family = "poisson";
      break;
    case config::ScoreFamily::kLog5:
      family = "log5";
      break;
  }
  std::string label = family;
  label += m.shape ? fmt::format(" shape={}", *m.shape) : std::string(" shape=fit");
  label += m.home_edge ? fmt::format(" home_edge={}", *m.home_edge) : std::string(" home_edge=fit");
  label += m.shrink_auto ? std::string(" shrink=auto") : fmt::format(" shrink={}", m.shrink_games);
  if (m.lopsided) label += fmt::format(" lopsided={}/{}", m.lopsided->margin, m.lopsided->weight);
  label += m.strength_uncertainty ? " uncertainty=on" : " uncertainty=off";
  return label;
}

History::History(sqlite3* db, fs::path file) : db_(db), file_(std::move(file)) {}
History::History(History&& o) noexcept : db_(std::exchange(o.db_, nullptr)), file_(o.file_) {}
History& History::operator=(History&& o) noexcept {
  if (this != &o) {
    if (db_) sqlite3_close(db_);
    db_ = std::exchange(o.db_, nullptr);
    file_ = o.file_;
  }
  return *this;
}
History::~History() {
  if (db_) sqlite3_close(db_);
}

History History::open(const fs::path& file, bool create) {
  std::error_code ec;
  const bool exists = fs::exists(file, ec);
  if (!exists && !create) {
    throw UsageError(fmt::format(
        "{}: no such history file (an odds run with a history records one)", file.string()));
  }
  if (!exists && file.has_parent_path()) {
    fs::create_directories(file.parent_path(), ec);
    if (ec) {
      throw UsageError(
          fmt::format("{}: cannot create its folder: {}", file.string(), ec.message()));
    }
  }
  sqlite3* raw = nullptr;
  const int flags = SQLITE_OPEN_READWRITE | (exists ? 0 : SQLITE_OPEN_CREATE);
  const int rc = sqlite3_open_v2(file.c_str(), &raw, flags, nullptr);
  History h(raw, file);  // closes the handle on any throw below
  if (rc != SQLITE_OK) fail(raw, file, rc, "cannot open");
  sqlite3_busy_timeout(raw, 10000);
  sqlite3_extended_result_codes(raw, 1);

  // Identify the file before touching it. Reading a file that is not an SQLite database fails
  // here with SQLITE_NOTADB; damaged pages fail the quick check.
  const std::int64_t app = pragma_int(raw, file, "PRAGMA application_id");
  const std::int64_t version = pragma_int(raw, file, "PRAGMA user_version");
  const std::int64_t tables = pragma_int(raw, file, "SELECT count(*) FROM sqlite_schema");
  if (app == 0 && version == 0 && tables == 0) {
    exec(raw, file, "BEGIN IMMEDIATE");
    exec(raw, file, SCHEMA);
    exec(raw, file,
         fmt::format("PRAGMA application_id = {}; PRAGMA user_version = {};",
                     HISTORY_APPLICATION_ID, HISTORY_SCHEMA_VERSION)
             .c_str());
    exec(raw, file, "COMMIT");
    return h;
  }
  if (app != HISTORY_APPLICATION_ID) {
    throw UsageError(fmt::format(
        "{}: an SQLite file, but not a standfast history (application id {}, expected {})",
        file.string(), app, HISTORY_APPLICATION_ID));
  }
  if (version != HISTORY_SCHEMA_VERSION) {
    throw UsageError(
        fmt::format("{}: a standfast history of schema version {}; this program reads version {}",
                    file.string(), version, HISTORY_SCHEMA_VERSION));
  }
  {
    Statement check(raw, file, "PRAGMA quick_check");
    std::string verdict = check.step() ? check.text(0) : std::string{};
    if (verdict != "ok") {
      for (char& c : verdict) c = c == '\n' ? ' ' : c;
      if (verdict.size() > 200) verdict = verdict.substr(0, 200) + "...";
      throw UsageError(fmt::format("{}: the history file is damaged: {}", file.string(), verdict));
    }
  }
  return h;
}

void History::record(const HistoryRun& run,
                     const std::function<void(int teams_written)>& after_team) {
  exec(db_, file_, "BEGIN IMMEDIATE");
  try {
    const std::string as_of = config::format_date(run.as_of);
    std::int64_t old_id = 0;
    {
      Statement find(db_, file_,
                     "SELECT id FROM run WHERE league = ? AND season_label = ? AND as_of = ? AND "
                     "model = ? AND seed = ? AND seasons = ?");
      find.bind(1, run.league)
          .bind(2, run.season_label)
          .bind(3, as_of)
          .bind(4, run.model)
          .bind(5, static_cast<std::int64_t>(run.seed))
          .bind(6, static_cast<std::int64_t>(run.seasons));
      if (find.step()) old_id = find.integer(0);
    }
    if (old_id != 0) {
      Statement(db_, file_, "DELETE FROM team_odds WHERE run_id = ?").bind(1, old_id).run();
      Statement(db_, file_, "DELETE FROM run WHERE id = ?").bind(1, old_id).run();
    }
    Statement insert(db_, file_,
                     "INSERT INTO run (league, season_label, as_of, season_hash, model, seed, "
                     "seasons, max_se, games_played) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)");
    insert.bind(1, run.league)
        .bind(2, run.season_label)
        .bind(3, as_of)
        .bind(4, run.season_hash)
        .bind(5, run.model)
        .bind(6, static_cast<std::int64_t>(run.seed))
        .bind(7, static_cast<std::int64_t>(run.seasons))
        .bind(8, run.max_se)
        .bind(9, static_cast<std::int64_t>(run.games_played));
    insert.run();
    const std::int64_t id = sqlite3_last_insert_rowid(db_);
    Statement team(db_, file_,
                   "INSERT INTO team_odds VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, "
                   "?, ?)");
    for (std::size_t i = 0; i < run.teams.size(); ++i) {
      const HistoryTeam& t = run.teams[i];
      Statement& row = team.reset();
      row.bind(1, id)
          .bind(2, static_cast<std::int64_t>(i))
          .bind(3, t.id)
          .bind(4, t.name)
          .bind(5, t.division_id)
          .bind(6, static_cast<std::int64_t>(t.wins))
          .bind(7, static_cast<std::int64_t>(t.losses))
          .bind(8, static_cast<std::int64_t>(t.games_left))
          .bind(9, t.division.p)
          .bind(10, t.division.se)
          .bind(11, t.postseason.p)
          .bind(12, t.postseason.se)
          .bind(13, t.bye.p)
          .bind(14, t.bye.se)
          .bind(15, t.title.p)
          .bind(16, t.title.se)
          .bind(17, t.mean_wins)
          .bind(18, join_counts(t.wins_histogram));
      row.run();
      if (after_team) after_team(static_cast<int>(i) + 1);
    }
    exec(db_, file_, "COMMIT");
  } catch (...) {
    sqlite3_exec(db_, "ROLLBACK", nullptr, nullptr, nullptr);
    throw;
  }
}

std::vector<HistoryTeam> History::teams_of(std::int64_t run_id) const {
  Statement s(db_, file_,
              "SELECT team, name, division, wins, losses, games_left, division_p, division_se, "
              "postseason_p, postseason_se, bye_p, bye_se, title_p, title_se, mean_wins, "
              "wins_histogram FROM team_odds WHERE run_id = ? ORDER BY position");
  s.bind(1, run_id);
  std::vector<HistoryTeam> teams;
  while (s.step()) {
    HistoryTeam t;
    t.id = s.text(0);
    t.name = s.text(1);
    t.division_id = s.text(2);
    t.wins = static_cast<int>(s.integer(3));
    t.losses = static_cast<int>(s.integer(4));
    t.games_left = static_cast<int>(s.integer(5));
    t.division = {s.real(6), s.real(7)};
    t.postseason = {s.real(8), s.real(9)};
    t.bye = {s.real(10), s.real(11)};
    t.title = {s.real(12), s.real(13)};
    t.mean_wins = s.real(14);
    t.wins_histogram = split_counts(s.text(15));
    teams.push_back(std::move(t));
  }
  return teams;
}

std::vector<HistoryRun> History::runs(const std::string& league,
                                      const std::string& season_label) const {
  std::vector<HistoryRun> out;
  {
    Statement s(db_, file_,
                "SELECT id, as_of, season_hash, model, seed, seasons, max_se, games_played FROM "
                "run WHERE id IN (SELECT max(id) FROM run WHERE league = ? AND season_label = ? "
                "GROUP BY as_of) ORDER BY as_of");
    s.bind(1, league).bind(2, season_label);
    while (s.step()) {
      HistoryRun r;
      r.id = s.integer(0);
      r.league = league;
      r.season_label = season_label;
      const auto day = config::parse_date(s.text(1));
      if (!day) {
        throw UsageError(fmt::format("{}: the history file is damaged: as-of date '{}'",
                                     file_.string(), s.text(1)));
      }
      r.as_of = *day;
      r.season_hash = s.text(2);
      r.model = s.text(3);
      r.seed = static_cast<std::uint64_t>(s.integer(4));
      r.seasons = static_cast<std::uint64_t>(s.integer(5));
      r.max_se = s.real(6);
      r.games_played = static_cast<int>(s.integer(7));
      out.push_back(std::move(r));
    }
  }
  for (HistoryRun& r : out) r.teams = teams_of(r.id);
  return out;
}

std::optional<HistoryRun> History::run_at(const std::string& league,
                                          const std::string& season_label,
                                          config::DayNumber as_of) const {
  for (HistoryRun& r : runs(league, season_label)) {
    if (r.as_of == as_of) return std::move(r);
  }
  return std::nullopt;
}

}  // namespace standfast::tools
