// "Did you mean" suggestions for misspelt keys, names and ids.
#ifndef STANDFAST_CONFIG_SUGGEST_H
#define STANDFAST_CONFIG_SUGGEST_H

#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace standfast::config {

// Levenshtein distance: the fewest single-character insertions, deletions and substitutions
// that turn `a` into `b`.
int edit_distance(std::string_view a, std::string_view b);

// Optimal string alignment distance (Damerau 1964, CACM 7(3)): as edit_distance, but swapping two
// adjacent characters also counts as one edit (PBE -> PEB is 1, not 2). Used for suggestions.
int transposition_distance(std::string_view a, std::string_view b);

// The candidate closest to `word` (ignoring case, by transposition_distance), if it is close
// enough to be a likely typo: at most max(1, min(3, length/3)) edits. Ties go to the earlier
// candidate.
std::optional<std::string> closest_match(std::string_view word,
                                         const std::vector<std::string>& candidates);

// " (did you mean 'X'?)" when there is a close match, else "".
std::string did_you_mean(std::string_view word, const std::vector<std::string>& candidates);

}  // namespace standfast::config

#endif  // STANDFAST_CONFIG_SUGGEST_H
