#include "tools/provenance.h"

#include <fmt/core.h>
#include <openssl/evp.h>

#include <algorithm>
#include <array>
#include <fstream>
#include <memory>

#include "config/as_of.h"
#include "models/score_dist.h"
#include "tools/cli.h"
#include "tools/output.h"

namespace standfast::tools {
namespace {

using Digest = std::unique_ptr<EVP_MD_CTX, decltype(&EVP_MD_CTX_free)>;

std::string hex(const unsigned char* bytes, unsigned int n) {
  std::string out;
  out.reserve(2 * n);
  for (unsigned int i = 0; i < n; ++i) out += fmt::format("{:02x}", bytes[i]);
  return out;
}

// The file name without its folder, for the table line.
std::string base_name(const std::string& path) {
  return std::filesystem::path(path).filename().string();
}

std::string optional_number(const std::optional<std::uint64_t>& v) {
  return v ? fmt::format("{}", *v) : std::string();
}

}  // namespace

std::string sha256_hex(std::string_view bytes) {
  Digest ctx(EVP_MD_CTX_new(), &EVP_MD_CTX_free);
  std::array<unsigned char, EVP_MAX_MD_SIZE> md{};
  unsigned int n = 0;
  if (!ctx || EVP_DigestInit_ex(ctx.get(), EVP_sha256(), nullptr) != 1 ||
      EVP_DigestUpdate(ctx.get(), bytes.data(), bytes.size()) != 1 ||
      EVP_DigestFinal_ex(ctx.get(), md.data(), &n) != 1) {
    throw std::runtime_error("SHA-256: the OpenSSL digest failed");
  }
  return hex(md.data(), n);
}

std::string sha256_file(const std::filesystem::path& file) {
  std::ifstream in(file, std::ios::binary);
  if (!in) return {};
  Digest ctx(EVP_MD_CTX_new(), &EVP_MD_CTX_free);
  if (!ctx || EVP_DigestInit_ex(ctx.get(), EVP_sha256(), nullptr) != 1) {
    throw std::runtime_error("SHA-256: the OpenSSL digest failed");
  }
  std::array<char, 1 << 16> buffer{};
  while (in) {
    in.read(buffer.data(), buffer.size());
    const std::streamsize got = in.gcount();
    if (got > 0 && EVP_DigestUpdate(ctx.get(), buffer.data(), static_cast<std::size_t>(got)) != 1) {
      throw std::runtime_error("SHA-256: the OpenSSL digest failed");
    }
  }
  if (in.bad()) return {};
  std::array<unsigned char, EVP_MAX_MD_SIZE> md{};
  unsigned int n = 0;
  if (EVP_DigestFinal_ex(ctx.get(), md.data(), &n) != 1) {
    throw std::runtime_error("SHA-256: the OpenSSL digest failed");
  }
  return hex(md.data(), n);
}

Provenance make_provenance(const config::Season& season) {
  Provenance p;
  p.program_version = std::string(program_version());
  p.season_file = season.file;
  p.season_sha256 = sha256_file(season.file);
  p.games_file = season.games_file;
  if (!season.games_file.empty()) p.games_sha256 = sha256_file(season.games_file);
  p.as_of = config::default_as_of(season);
  return p;
}

void set_model(Provenance& p, const config::Season& season, double shape_used) {
  const config::ModelSpec& model = season.model;
  p.family = model.family;
  const bool has_shape = model.family == config::ScoreFamily::kWeibull ||
                         model.family == config::ScoreFamily::kNegativeBinomial;
  p.shape = has_shape ? std::optional<double>(shape_used) : std::nullopt;
  const bool played = std::any_of(season.games.begin(), season.games.end(),
                                  [](const config::Game& g) { return g.played; });
  p.shape_source = !has_shape ? "" : model.shape ? "fixed" : played ? "fitted" : "default";
}

std::string provenance_line(const Provenance& p) {
  // The table shows the first 12 hex digits of each hash; CSV and JSON have all 64.
  const auto file = [](const std::string& path, const std::string& sha) {
    return fmt::format("{} sha256 {}", base_name(path),
                       sha.empty() ? std::string("(unreadable)") : sha.substr(0, 12));
  };
  std::string out = fmt::format("Run: standfast {}", p.program_version);
  // A report of no season file (the backtest's synthetic seasons) has no files and no as-of date.
  if (!p.season_file.empty()) {
    out += "; " + file(p.season_file, p.season_sha256);
    if (!p.games_file.empty()) out += ", " + file(p.games_file, p.games_sha256);
    out += fmt::format("; as of {}",
                       p.as_of ? config::format_date(*p.as_of) : std::string("(no dated game)"));
  }
  if (p.family) {
    out += fmt::format("; model {}", models::family_name(*p.family));
    if (p.shape) {
      out += fmt::format(", shape {:.3f} ({})", *p.shape, p.shape_source);
    }
  }
  if (p.seed) out += fmt::format("; seed {}", *p.seed);
  if (p.seasons) out += fmt::format("; {} seasons", group_digits(*p.seasons));
  return out;
}

std::string provenance_csv_header() {
  return ",run_version,run_season_file,run_season_sha256,run_games_file,run_games_sha256,"
         "run_as_of,run_family,run_shape,run_shape_source,run_seed,run_seasons";
}

std::string provenance_csv_cells(const Provenance& p) {
  return fmt::format(",{},{},{},{},{},{},{},{},{},{},{}", csv_field(p.program_version),
                     csv_field(p.season_file), p.season_sha256, csv_field(p.games_file),
                     p.games_sha256, p.as_of ? config::format_date(*p.as_of) : std::string(),
                     p.family ? models::family_name(*p.family) : "",
                     p.shape ? fmt::format("{:.6g}", *p.shape) : std::string(), p.shape_source,
                     optional_number(p.seed), optional_number(p.seasons));
}

nlohmann::ordered_json provenance_json(const Provenance& p) {
  using nlohmann::ordered_json;
  const auto text_or_null = [](const std::string& s) {
    return s.empty() ? ordered_json(nullptr) : ordered_json(s);
  };
  ordered_json run;
  run["program_version"] = p.program_version;
  run["season_file"] = p.season_file;
  run["season_sha256"] = text_or_null(p.season_sha256);
  run["games_file"] = text_or_null(p.games_file);
  run["games_sha256"] = text_or_null(p.games_sha256);
  run["as_of"] = p.as_of ? ordered_json(config::format_date(*p.as_of)) : ordered_json(nullptr);
  run["family"] = p.family ? ordered_json(models::family_name(*p.family)) : ordered_json(nullptr);
  run["shape"] = p.shape ? ordered_json(*p.shape) : ordered_json(nullptr);
  run["shape_source"] = text_or_null(p.shape_source);
  run["seed"] = p.seed ? ordered_json(*p.seed) : ordered_json(nullptr);
  run["seasons"] = p.seasons ? ordered_json(*p.seasons) : ordered_json(nullptr);
  return run;
}

}  // namespace standfast::tools
