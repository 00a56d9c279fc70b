#include "engine/compare.h"

#include <tbb/blocked_range.h>
#include <tbb/enumerable_thread_specific.h>
#include <tbb/global_control.h>
#include <tbb/parallel_for.h>

#include <algorithm>
#include <cmath>
#include <memory>
#include <optional>
#include <stdexcept>
#include <string>

#include "engine/season_runner.h"
#include "engine/streams.h"
#include "engine/tally.h"

namespace standfast::engine {

namespace {

using detail::SeasonRunner;
using detail::Worker;

constexpr std::uint64_t GRAIN = 32;  // seasons per task (any value gives the same result)
constexpr int CHANCES = 4;           // division, postseason, bye, title

// Joint counts of one season's outcomes under the baseline and each alternative, per team.
struct JointTally {
  // [(alt * teams + team) * CHANCES + chance]
  std::vector<std::uint64_t> base_only, alt_only;
  // [alt * teams + team]: sums of (alt wins - base wins) and of its square.
  std::vector<std::int64_t> wins_diff;
  std::vector<std::uint64_t> wins_diff2;

  JointTally(std::size_t alts, std::size_t teams)
      : base_only(alts * teams * CHANCES),
        alt_only(alts * teams * CHANCES),
        wins_diff(alts * teams),
        wins_diff2(alts * teams) {}

  void merge(const JointTally& o) {
    for (std::size_t i = 0; i < base_only.size(); ++i) {
      base_only[i] += o.base_only[i];
      alt_only[i] += o.alt_only[i];
    }
    for (std::size_t i = 0; i < wins_diff.size(); ++i) {
      wins_diff[i] += o.wins_diff[i];
      wins_diff2[i] += o.wins_diff2[i];
    }
  }
};

// One thread's state: a Worker per plan (baseline first) and the joint counts.
struct PairWorker {
  std::vector<std::unique_ptr<Worker>> workers;
  JointTally joint;

  explicit PairWorker(std::span<const Plan* const> plans)
      : joint(plans.size() - 1, static_cast<std::size_t>(plans.front()->teams)) {
    for (const Plan* p : plans) workers.push_back(std::make_unique<Worker>(*p));
  }
};

// The season's outcome of team t as bits: division, postseason, bye, title.
unsigned outcome_bits(const Worker& w, std::size_t t) {
  return static_cast<unsigned>(w.division_winner[t] != 0) |
         static_cast<unsigned>(w.seed_of[t] > 0) << 1 |
         static_cast<unsigned>(w.is_bye[t] != 0) << 2 |
         static_cast<unsigned>(w.champion == static_cast<int>(t)) << 3;
}

void tally_joint(const PairWorker& pw, JointTally& joint, std::size_t teams) {
  const Worker& base = *pw.workers.front();
  for (std::size_t a = 1; a < pw.workers.size(); ++a) {
    const Worker& alt = *pw.workers[a];
    for (std::size_t t = 0; t < teams; ++t) {
      const unsigned b = outcome_bits(base, t), x = outcome_bits(alt, t);
      const std::size_t at = (a - 1) * teams + t;
      std::uint64_t* base_only = joint.base_only.data() + at * CHANCES;
      std::uint64_t* alt_only = joint.alt_only.data() + at * CHANCES;
      for (int c = 0; c < CHANCES; ++c) {
        base_only[c] += (b & ~x) >> c & 1u;
        alt_only[c] += (x & ~b) >> c & 1u;
      }
      const int ti = static_cast<int>(t);
      const std::int64_t d = alt.record.wins(ti) - base.record.wins(ti);
      joint.wins_diff[at] += d;
      joint.wins_diff2[at] += static_cast<std::uint64_t>(d * d);
    }
  }
}

double wins_variance(const TeamOdds& t) {
  double n = 0, s = 0, s2 = 0;
  for (std::size_t w = 0; w < t.wins_histogram.size(); ++w) {
    const auto c = static_cast<double>(t.wins_histogram[w]);
    n += c;
    s += c * static_cast<double>(w);
    s2 += c * static_cast<double>(w) * static_cast<double>(w);
  }
  if (n <= 0) return 0;
  const double m = s / n;
  return std::max(s2 / n - m * m, 0.0);
}

std::uint64_t count_of(const Probability& p, std::uint64_t n) {
  return static_cast<std::uint64_t>(std::llround(p.p * static_cast<double>(n)));
}

}  // namespace

PairedChance paired_chance(std::uint64_t base_count, std::uint64_t alt_count,
                           std::uint64_t base_only, std::uint64_t alt_only, std::uint64_t n) {
  PairedChance c;
  if (n == 0) return c;
  const double nn = static_cast<double>(n);
  c.base = static_cast<double>(base_count) / nn;
  c.alt = static_cast<double>(alt_count) / nn;
  c.diff = (static_cast<double>(alt_count) - static_cast<double>(base_count)) / nn;
  const double e2 = (static_cast<double>(alt_only) + static_cast<double>(base_only)) / nn;
  c.se_paired = std::sqrt(std::max(e2 - c.diff * c.diff, 0.0) / nn);
  c.se_unpaired = std::sqrt((c.base * (1 - c.base) + c.alt * (1 - c.alt)) / nn);
  return c;
}

Comparison compare_plans(const Plan& baseline, std::span<const Plan* const> alternatives,
                         const RunOptions& options) {
  if (options.batch == 0) throw std::invalid_argument("compare_plans: batch must be > 0");
  if (options.threads < 0)
    throw std::invalid_argument("compare_plans: threads must be >= 0, got " +
                                std::to_string(options.threads));
  if (baseline.teams < 2) throw std::invalid_argument("compare_plans: the plan has no league");
  std::vector<const Plan*> plans{&baseline};
  for (const Plan* p : alternatives) {
    if (p == nullptr || p->teams != baseline.teams || p->team_ids != baseline.team_ids)
      throw std::invalid_argument("compare_plans: every plan must be of the same league");
    plans.push_back(p);
  }
  std::optional<tbb::global_control> control;
  if (options.threads > 0)
    control.emplace(tbb::global_control::max_allowed_parallelism,
                    static_cast<std::size_t>(options.threads));

  std::vector<std::unique_ptr<SeasonRunner>> runners;
  for (const Plan* p : plans)
    runners.push_back(std::make_unique<SeasonRunner>(*p, options.postseason));
  const auto teams = static_cast<std::size_t>(baseline.teams);
  tbb::enumerable_thread_specific<PairWorker> workers([&] { return PairWorker(plans); });

  std::uint64_t done = 0;
  while (done < options.seasons) {
    const std::uint64_t end = std::min(options.seasons, done + options.batch);
    tbb::parallel_for(
        tbb::blocked_range<std::uint64_t>(done, end, GRAIN),
        [&](const tbb::blocked_range<std::uint64_t>& range) {
          PairWorker& pw = workers.local();
          for (std::uint64_t s = range.begin(); s < range.end(); ++s) {
            for (std::size_t p = 0; p < plans.size(); ++p) {
              SeasonStreams streams(options.seed, s);
              runners[p]->run(streams, *pw.workers[p]);
            }
            tally_joint(pw, pw.joint, teams);
          }
        },
        tbb::simple_partitioner());
    done = end;
    if (options.progress) options.progress(done, options.seasons);
  }

  Comparison out;
  JointTally joint(plans.size() - 1, teams);
  for (const PairWorker& pw : workers) joint.merge(pw.joint);
  std::vector<SimulationResult> results(plans.size());
  for (std::size_t p = 0; p < plans.size(); ++p) {
    const Plan& plan = *plans[p];
    Tally total(plan.teams, static_cast<int>(plan.rounds.size()), plan.max_games,
                std::max(plan.max_seed, 1));
    for (const PairWorker& pw : workers) total.merge(pw.workers[p]->tally);
    total.fill(results[p]);
    results[p].seed = options.seed;
    for (const auto& r : plan.rounds) results[p].round_names.push_back(r.name);
  }
  const std::uint64_t n = results.front().seasons;
  out.baseline = results.front();
  for (std::size_t a = 1; a < plans.size(); ++a) {
    AlternativeResult alt;
    alt.result = results[a];
    for (std::size_t t = 0; t < teams; ++t) {
      const TeamOdds& b = out.baseline.teams[t];
      const TeamOdds& x = alt.result.teams[t];
      const std::size_t at = (a - 1) * teams + t;
      const std::uint64_t* base_only = joint.base_only.data() + at * CHANCES;
      const std::uint64_t* alt_only = joint.alt_only.data() + at * CHANCES;
      auto chance = [&](const Probability& pb, const Probability& px, int c) {
        return paired_chance(count_of(pb, n), count_of(px, n), base_only[c], alt_only[c], n);
      };
      TeamComparison tc;
      tc.division = chance(b.division, x.division, 0);
      tc.postseason = chance(b.postseason, x.postseason, 1);
      tc.bye = chance(b.bye, x.bye, 2);
      tc.title = chance(b.title, x.title, 3);
      const double nn = static_cast<double>(std::max<std::uint64_t>(n, 1));
      tc.wins.base = b.mean_wins;
      tc.wins.alt = x.mean_wins;
      const double md = static_cast<double>(joint.wins_diff[at]) / nn;
      tc.wins.diff = md;
      tc.wins.se_paired =
          std::sqrt(std::max(static_cast<double>(joint.wins_diff2[at]) / nn - md * md, 0.0) / nn);
      tc.wins.se_unpaired = std::sqrt((wins_variance(b) + wins_variance(x)) / nn);
      alt.teams.push_back(tc);
    }
    out.alternatives.push_back(std::move(alt));
  }
  return out;
}

}  // namespace standfast::engine
