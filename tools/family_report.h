// Model sensitivity (`standfast families`, fields in tools/FAMILIES.md): each team's chances
// under every scoring family, all run on the same random numbers (engine/compare.h), side by side
// with the spread between the families (model risk), as a terminal table, CSV or JSON, each with
// the provenance and the caution line.
#ifndef STANDFAST_TOOLS_FAMILY_REPORT_H
#define STANDFAST_TOOLS_FAMILY_REPORT_H

#include <string>
#include <vector>

#include "engine/compare.h"
#include "tools/provenance.h"
#include "tools/scenario_report.h"

namespace standfast::tools {

inline constexpr int FAMILIES_SCHEMA_VERSION = 1;

// The chances a report covers, in this order; `mean_wins` is not a probability.
inline constexpr const char* FAMILY_CHANCES[] = {"division", "postseason", "bye", "title",
                                                 "mean_wins"};

struct FamilyModel {
  ModelUsed model;           // family and shape used
  std::string shape_source;  // "fitted", "fixed", "default" or "" (no shape)
};

// One chance of one team under every family.
struct FamilySpread {
  std::vector<double> values;  // per family, FamiliesReport::models order
  // Per family: the paired change from the first family and its errors (0 for the first).
  std::vector<engine::PairedChance> changes;
  double spread = 0;  // largest value - smallest value
  // The Monte Carlo standard error of the spread is at most the sum of the paired errors of the
  // largest and the smallest against the first family (sd(X - Y) <= sd(X - B) + sd(Y - B)).
  double spread_se_bound = 0;
  int highest = 0, lowest = 0;  // family indexes
};

struct FamilyTeam {
  std::string id, name;
  std::vector<FamilySpread> chances;  // FAMILY_CHANCES order
};

struct FamiliesReport {
  Provenance run;  // of the first (reference) family
  std::string league, season_label;
  std::vector<FamilyModel> models;                           // the reference family first
  std::vector<std::pair<std::string, std::string>> skipped;  // (family, why)
  std::vector<FamilyTeam> teams;                             // Season::teams order
  std::string shown = "postseason";                          // the chance the table shows
};

// Index of a chance name in FAMILY_CHANCES, or -1.
int family_chance_index(const std::string& name);

// Fills the teams from a comparison whose baseline is models[0] and whose alternatives are
// models[1..] in order.
void fill_family_teams(FamiliesReport& report, const engine::Comparison& comparison,
                       const std::vector<std::string>& ids, const std::vector<std::string>& names);

std::string write_families_table(const FamiliesReport& report);
std::string write_families_csv(const FamiliesReport& report);
std::string write_families_json(const FamiliesReport& report);

}  // namespace standfast::tools

#endif  // STANDFAST_TOOLS_FAMILY_REPORT_H
