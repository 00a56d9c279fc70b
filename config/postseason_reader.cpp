#include "config/postseason_reader.h"

#include <cmath>

#include "config/bracket.h"
#include "config/suggest.h"

namespace standfast::config::detail {

namespace {

// One `qualify` block as written; empty values fall back to the league-wide block, then to
// the defaults.
struct QualifySpec {
  std::optional<int> division_winners, at_large, byes;
  std::optional<bool> winners_first;
  SourcePos division_winners_pos, at_large_pos, byes_pos;
};

QualifySpec read_qualify(YamlContext& ctx, const YAML::Node& node, const std::string& path) {
  QualifySpec q;
  MapView m(ctx, node, path, {"division_winners", "at_large", "byes", "winners_first"});
  if (!m.ok()) return q;
  if (auto n = m.get("division_winners")) {
    q.division_winners = ctx.integer(*n, m.sub("division_winners"), 0, 1000);
    q.division_winners_pos = ctx.pos(*n);
  }
  if (auto n = m.get("at_large")) {
    q.at_large = ctx.integer(*n, m.sub("at_large"), 0, 1000);
    q.at_large_pos = ctx.pos(*n);
  }
  if (auto n = m.get("byes")) {
    q.byes = ctx.integer(*n, m.sub("byes"), 0, 1000);
    q.byes_pos = ctx.pos(*n);
  }
  if (auto n = m.get("winners_first")) q.winners_first = ctx.boolean(*n, m.sub("winners_first"));
  return q;
}

// The later block wins key by key.
QualifySpec merge(const QualifySpec& base, const QualifySpec& over) {
  QualifySpec q = base;
  if (over.division_winners) {
    q.division_winners = over.division_winners;
    q.division_winners_pos = over.division_winners_pos;
  }
  if (over.at_large) {
    q.at_large = over.at_large;
    q.at_large_pos = over.at_large_pos;
  }
  if (over.byes) {
    q.byes = over.byes;
    q.byes_pos = over.byes_pos;
  }
  if (over.winners_first) q.winners_first = over.winners_first;
  return q;
}

const SourcePos& first_known(const SourcePos& a, const SourcePos& b) { return a.line > 0 ? a : b; }

void read_round(YamlContext& ctx, const YAML::Node& node, const std::string& path,
                std::size_t index, Postseason& ps) {
  MapView m(ctx, node, path, {"name", "best_of", "hosts"});
  if (!m.ok()) return;
  Round round;
  round.pos = ctx.pos(node);
  round.name = "Round " + std::to_string(index + 1);
  if (auto n = m.get("name")) round.name = ctx.text(*n, m.sub("name")).value_or(round.name);
  int best_of = 0;  // 0 = missing or wrong
  if (auto n = m.require("best_of")) {
    best_of = ctx.integer(*n, m.sub("best_of"), 1, 99).value_or(0);
    if (best_of > 0 && best_of % 2 == 0) {
      ctx.error(*n,
                m.sub("best_of") + ": a series length must be odd, got " + std::to_string(best_of));
      best_of = 0;
    }
  }
  std::vector<int> blocks;
  if (auto n = m.get("hosts")) {
    if (ctx.is_list(*n, m.sub("hosts"))) {
      bool ok = n->size() > 0;
      if (!ok) ctx.error(*n, m.sub("hosts") + ": is empty");
      for (std::size_t i = 0; i < n->size(); ++i) {
        const auto b = ctx.integer((*n)[i], m.sub("hosts") + "[" + std::to_string(i) + "]", 1, 99);
        ok = ok && b.has_value();
        blocks.push_back(b.value_or(0));
      }
      int sum = 0;
      for (const int b : blocks) sum += b;
      if (ok && best_of > 0 && sum != best_of) {
        ctx.error(*n, m.sub("hosts") + ": the blocks add up to " + std::to_string(sum) +
                          " games but the series is best of " + std::to_string(best_of));
        ok = false;
      }
      if (!ok) blocks.clear();
    }
  } else if (best_of > 0) {
    blocks = default_hosts(best_of);
  }
  if (best_of == 0 || blocks.empty()) return;
  round.best_of = best_of;
  bool higher = true;
  for (const int b : blocks) {
    for (int i = 0; i < b; ++i) round.higher_hosts.push_back(higher);
    higher = !higher;
  }
  ps.rounds.push_back(std::move(round));
}

std::string plural(int n, const char* one, const char* many) {
  return std::to_string(n) + " " + (n == 1 ? one : many);
}

}  // namespace

std::vector<int> default_hosts(int best_of) {
  if (best_of == 5) return {2, 2, 1};
  if (best_of == 7) return {2, 3, 2};
  return std::vector<int>(static_cast<std::size_t>(best_of), 1);
}

void read_postseason(YamlContext& ctx, const YAML::Node& node, Season& season) {
  Postseason& ps = season.postseason;
  ps.enabled = true;
  ps.pos = ctx.pos(node);
  const std::size_t errors_before = ctx.report().error_count();
  MapView m(ctx, node, "postseason", {"format", "qualify", "per_conference", "reseed", "rounds"});
  if (!m.ok()) return;
  SourcePos format_pos = ps.pos;
  if (auto n = m.get("format")) {
    format_pos = ctx.pos(*n);
    const auto f = ctx.text(*n, m.sub("format"));
    if (f && *f == "conference_brackets") {
      ps.format = BracketFormat::kConferenceBrackets;
    } else if (f && *f == "single_bracket") {
      ps.format = BracketFormat::kSingleBracket;
    } else if (f) {
      ctx.error(*n, m.sub("format") + ": unknown format " + quoted(*f) +
                        did_you_mean(*f, {"conference_brackets", "single_bracket"}) +
                        "; known: conference_brackets, single_bracket");
    }
  }
  if (auto n = m.get("reseed")) ps.reseed = ctx.boolean(*n, m.sub("reseed")).value_or(false);

  QualifySpec league_wide;
  if (auto n = m.get("qualify")) league_wide = read_qualify(ctx, *n, m.sub("qualify"));
  std::vector<QualifySpec> specs(season.conferences.size(), league_wide);
  if (auto n = m.get("per_conference")) {
    std::vector<std::string> conference_ids;
    for (const int c : season.conferences) {
      conference_ids.push_back(season.groups[static_cast<std::size_t>(c)].id);
    }
    MapView pc(ctx, *n, m.sub("per_conference"), conference_ids);
    if (pc.ok()) {
      for (std::size_t c = 0; c < conference_ids.size(); ++c) {
        if (auto v = pc.get(conference_ids[c])) {
          specs[c] = merge(league_wide, read_qualify(ctx, *v, pc.sub(conference_ids[c])));
        }
      }
    }
  }

  std::optional<YAML::Node> rounds_node = m.require("rounds");
  if (rounds_node && ctx.is_list(*rounds_node, m.sub("rounds"))) {
    if (rounds_node->size() == 0) ctx.error(*rounds_node, m.sub("rounds") + ": is empty");
    for (std::size_t i = 0; i < rounds_node->size(); ++i) {
      read_round(ctx, (*rounds_node)[i], m.sub("rounds") + "[" + std::to_string(i) + "]", i, ps);
    }
  }

  // Qualifying per conference, with its checks.
  ps.qualifying.clear();
  int total_field = 0;
  int total_byes = 0;
  std::vector<int> field_of(season.conferences.size(), 0);
  for (std::size_t c = 0; c < season.conferences.size(); ++c) {
    const int conf = season.conferences[c];
    const Group& group = season.groups[static_cast<std::size_t>(conf)];
    int teams = 0;
    for (const Team& t : season.teams) teams += t.conference == conf ? 1 : 0;
    int divisions = 0;
    for (const int d : season.divisions) {
      int g = d;
      while (season.groups[static_cast<std::size_t>(g)].parent >= 0) {
        g = season.groups[static_cast<std::size_t>(g)].parent;
      }
      divisions += g == conf ? 1 : 0;
    }
    const QualifySpec& s = specs[c];
    Qualifying q;
    q.conference = conf;
    q.division_winners = s.division_winners.value_or(divisions);
    q.at_large = s.at_large.value_or(0);
    q.byes = s.byes.value_or(0);
    q.winners_first = s.winners_first.value_or(true);
    const std::string name = "conference " + quoted(group.id);
    if (q.division_winners > divisions) {
      ctx.report().error(first_known(s.division_winners_pos, ps.pos),
                         "postseason: " + std::to_string(q.division_winners) +
                             " division winners qualify but " + name + " has " +
                             plural(divisions, "division", "divisions"));
    }
    const int field = q.division_winners + q.at_large;
    if (field > teams) {
      ctx.report().error(first_known(s.at_large_pos, first_known(s.division_winners_pos, ps.pos)),
                         "postseason: " + std::to_string(field) + " qualifiers (" +
                             std::to_string(q.division_winners) + " division winners + " +
                             std::to_string(q.at_large) + " at-large) but " + name + " has " +
                             plural(teams, "team", "teams"));
    }
    if (q.byes > 0 && q.byes >= field) {
      ctx.report().error(first_known(s.byes_pos, ps.pos),
                         "postseason: " + plural(q.byes, "bye", "byes") + " in " + name +
                             " but its field is " + plural(field, "team", "teams") +
                             "; byes must be fewer than the field");
    }
    field_of[c] = field;
    total_field += field;
    total_byes += q.byes;
    ps.qualifying.push_back(q);
  }

  // The bracket: does it reduce the field to one team, in as many rounds as are listed?
  if (ctx.report().error_count() != errors_before || season.conferences.empty()) return;
  const SourcePos rounds_pos = rounds_node ? ctx.pos(*rounds_node) : ps.pos;
  int needed = 0;
  std::string why;
  const auto explain = [](int field, int byes) {
    std::string s =
        "a field of " + plural(field, "team", "teams") + " with " + plural(byes, "bye", "byes");
    if (field == 1) return s;
    if ((field - byes) % 2 != 0) {
      return s + " leaves " + std::to_string(field - byes) +
             " teams to play the first round, an odd number";
    }
    return s + " leaves " + std::to_string((field - byes) / 2 + byes) +
           " teams after the first round, not a power of two";
  };
  if (ps.format == BracketFormat::kSingleBracket) {
    if (total_field < 1) {
      ctx.report().error(ps.pos, "postseason: no team qualifies");
      return;
    }
    needed = bracket_rounds(total_field, total_byes);
    if (needed < 0) {
      ctx.report().error(ps.pos, "postseason: the bracket cannot reduce to one team: " +
                                     explain(total_field, total_byes));
      return;
    }
    why = plural(total_field, "team", "teams") + " with " + plural(total_byes, "bye", "byes");
  } else {
    int per_conference = -1;
    std::string first_name;
    for (std::size_t c = 0; c < ps.qualifying.size(); ++c) {
      const Qualifying& q = ps.qualifying[c];
      const std::string name = quoted(season.groups[static_cast<std::size_t>(q.conference)].id);
      if (field_of[c] < 1) {
        ctx.report().error(ps.pos, "postseason: no team of conference " + name + " qualifies");
        return;
      }
      const int r = bracket_rounds(field_of[c], q.byes);
      if (r < 0) {
        ctx.report().error(first_known(specs[c].byes_pos, ps.pos),
                           "postseason: the bracket of conference " + name +
                               " cannot reduce to one team: " + explain(field_of[c], q.byes));
        return;
      }
      if (per_conference >= 0 && r != per_conference) {
        ctx.report().error(ps.pos, "postseason: conference " + first_name + " needs " +
                                       plural(per_conference, "round", "rounds") +
                                       " but conference " + name + " needs " +
                                       plural(r, "round", "rounds") +
                                       "; every conference must need the same number");
        return;
      }
      if (per_conference < 0) {
        per_conference = r;
        first_name = name;
      }
    }
    const int conferences = static_cast<int>(season.conferences.size());
    const int final_rounds = exact_log2(conferences);
    if (final_rounds < 0) {
      ctx.report().error(format_pos, "postseason.format: conference_brackets with " +
                                         std::to_string(conferences) +
                                         " conferences cannot end in one final (the number of "
                                         "conferences must be a power of two); use "
                                         "single_bracket");
      return;
    }
    needed = per_conference + final_rounds;
    why = plural(per_conference, "round", "rounds") + " in each conference";
    if (final_rounds > 0) {
      why += " + " + plural(final_rounds, "round", "rounds") + " between the " +
             std::to_string(conferences) + " conference winners";
    }
  }
  const int listed = rounds_node && rounds_node->IsSequence()
                         ? static_cast<int>(rounds_node->size())
                         : static_cast<int>(ps.rounds.size());
  if (listed != needed) {
    ctx.report().error(rounds_pos,
                       "postseason.rounds: " + plural(listed, "round is", "rounds are") +
                           " listed but the bracket needs " + std::to_string(needed) + " (" + why +
                           ")");
  }
}

}  // namespace standfast::config::detail
