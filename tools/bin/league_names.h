// Invented names for the generated demo leagues (used only by tools/bin/make_league.cpp).
// Every club, place, venue, league and conference name here is made up for this project.
#ifndef STANDFAST_TOOLS_BIN_LEAGUE_NAMES_H
#define STANDFAST_TOOLS_BIN_LEAGUE_NAMES_H

#include <array>
#include <string_view>

namespace standfast::tools::names {

struct ClubName {
  std::string_view id;
  std::string_view name;
  std::string_view venue;
};

// Thirty-two clubs for the demo league, in the order they fill the divisions.
inline constexpr std::array<ClubName, 32> DEMO_CLUBS = {{
    {"AMB", "Amberlow Comets", "Comet Ridge Park"},
    {"BRK", "Brackenvane Owls", "Vane Street Grounds"},
    {"CRV", "Corvane Ironbacks", "Foundry Park"},
    {"DUN", "Dunmarrow Stags", "Marrow Field"},
    {"ELM", "Elmsreach Wardens", "Reach Commons"},
    {"FNW", "Fennowick Lamplighters", "Lamp Hill Park"},
    {"GLM", "Glimmerdale Hornets", "The Hive"},
    {"HLV", "Halvesund Pilots", "Sound Harbour Park"},
    {"IVH", "Ivorhollow Tinsmiths", "Tinworks Field"},
    {"JSP", "Jasperine Coyotes", "Jasper Flats Park"},
    {"KTW", "Kettlewyn Millers", "Millrace Field"},
    {"LNT", "Lanterby Moths", "Lantern Green"},
    {"MOS", "Mossgarde Rooks", "Rookery Park"},
    {"NTH", "Nethercast Voyagers", "Castmoor Stadium"},
    {"OST", "Ostrelle Foxhounds", "Kennel Lane Field"},
    {"PLV", "Pelvane Bay Gulls", "Breakwall Park"},
    {"QUI", "Quillmere Herons", "Heronry Field"},
    {"RSK", "Rasketh Smelters", "Cinderworks Field"},
    {"SAB", "Sablethorn Wolves", "Thornwood Grounds"},
    {"TRN", "Tarnhollow Badgers", "Sett Field"},
    {"UMB", "Umberquay Sparrows", "Sparrow Common"},
    {"VEL", "Velmora Kestrels", "Kestrel Yard"},
    {"WRN", "Wrenmouth Anglers", "Anglers Quay"},
    {"YAR", "Yarrowick Thrushes", "Thrush Meadow"},
    {"ZEP", "Zephyrine Kites", "Kite Hill Park"},
    {"BRN", "Brinmoor Drovers", "Drovers Oval"},
    {"CSK", "Caskwell Coopers", "Barrelhouse Field"},
    {"FRM", "Frostmere Huskies", "Icehouse Park"},
    {"GRW", "Graywick Tanners", "Tannery Row Park"},
    {"RVL", "Rivelmark Quarrymen", "The Quarry Bowl"},
    {"LUM", "Lumenford Gleaners", "Gleaning Field"},
    {"TEM", "Tembrook Ferrymen", "Ferry Landing Park"},
}};

// Six clubs for the small league.
inline constexpr std::array<ClubName, 6> SMALL_CLUBS = {{
    {"LRK", "Mirrowmoor Larks", "Larkspur Field"},
    {"CRT", "Oakhelm Carters", "Wagonyard Park"},
    {"PEB", "Pebbleford Skippers", "Skipping Stone Park"},
    {"RSH", "Rushbarrow Plovers", "Plover Flats"},
    {"STW", "Stillwick Bellringers", "Belfry Grounds"},
    {"TUM", "Tumbledown Hares", "Warren Field"},
}};

}  // namespace standfast::tools::names

#endif  // STANDFAST_TOOLS_BIN_LEAGUE_NAMES_H
