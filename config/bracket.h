// The arithmetic of a knockout bracket with byes.
#ifndef STANDFAST_CONFIG_BRACKET_H
#define STANDFAST_CONFIG_BRACKET_H

namespace standfast::config {

// Rounds needed to reduce a field of `field` teams, `byes` of which skip the first round, to one
// team; -1 when no bracket does it. The first round is played by field - byes teams (an even
// number); its winners and the bye teams, (field - byes)/2 + byes, must be a power of two. A field
// that is a power of two with no byes needs no special first round (the same formula gives
// log2(field)). A field of one needs no round.
int bracket_rounds(int field, int byes);

// log2(n) for a power of two n >= 1; -1 otherwise.
int exact_log2(int n);

}  // namespace standfast::config

#endif  // STANDFAST_CONFIG_BRACKET_H
