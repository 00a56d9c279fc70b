// Placeholder so the library has a source; removed once models/ has real sources.
namespace standfast::models {}
