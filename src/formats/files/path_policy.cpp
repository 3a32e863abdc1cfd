#include "formats/files/path_policy.hpp"

#include <algorithm>
#include <array>
#include <cctype>
#include <string>

#include "core/errors.hpp"

namespace slipscreen::formats {

namespace {

std::string lower(std::string_view s) {
  std::string out(s);
  std::transform(out.begin(), out.end(), out.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
  return out;
}

// "xx:" at the start: two or more letters/digits/underscores (first a letter), then ':'.
bool has_driver_prefix(std::string_view s) {
  std::size_t i = 0;
  if (s.empty() || !std::isalpha(static_cast<unsigned char>(s[0]))) return false;
  while (i < s.size() && (std::isalnum(static_cast<unsigned char>(s[i])) || s[i] == '_')) ++i;
  return i >= 2 && i < s.size() && s[i] == ':';
}

}  // namespace

bool is_network_path(std::string_view path) {
  const std::string p = lower(path);
  static constexpr std::array<std::string_view, 10> kNetworkVsi = {
      "/vsicurl", "/vsis3", "/vsigs", "/vsiaz", "/vsiadls",
      "/vsioss", "/vsiswift", "/vsiwebhdfs", "/vsihdfs", "/vsiwebdav"};
  for (auto prefix : kNetworkVsi)
    if (p.find(prefix) != std::string::npos) return true;
  if (p.find("://") != std::string::npos) return true;
  return has_driver_prefix(p);
}

bool is_virtual_or_network_path(std::string_view path) {
  return lower(path).rfind("/vsi", 0) == 0 || is_network_path(path);
}

void require_local_path(std::string_view path, bool allow_network, std::string_view field) {
  if (allow_network || !is_network_path(path)) return;
  throw RefusedError(std::string(field) + " = '" + std::string(path) +
                     "': network paths and connection strings are refused (only local files may "
                     "be read) unless network access is explicitly allowed");
}

bool has_control_character(std::string_view text) {
  return std::any_of(text.begin(), text.end(), [](char c) {
    const auto u = static_cast<unsigned char>(c);
    return u < 0x20 || u == 0x7f;
  });
}

std::string escaped_text(std::string_view text) {
  std::string out;
  for (char c : text) {
    const auto u = static_cast<unsigned char>(c);
    if (c == '\n') out += "\\n";
    else if (c == '\t') out += "\\t";
    else if (c == '\r') out += "\\r";
    else if (c == '\0') out += "\\0";
    else if (u < 0x20 || u == 0x7f) {
      static constexpr char kHex[] = "0123456789abcdef";
      out += "\\x";
      out += kHex[u >> 4];
      out += kHex[u & 0xf];
    } else {
      out += c;
    }
  }
  return out;
}

std::filesystem::path safe_relative_output(std::string_view key, std::string_view value) {
  const std::string k(key), v(value);
  auto refuse = [&](const std::string& why) {
    throw RefusedError(k + " = '" + escaped_text(v) + "': " + why +
                       "; output paths must be relative paths inside the run folder");
  };
  if (v.empty()) refuse("empty path");
  if (has_control_character(v)) refuse("a control character (newline, tab, NUL, ...) in a file name");
  if (is_network_path(v)) refuse("a network path or connection string");
  const std::filesystem::path p(v);
  if (p.is_absolute() || p.has_root_name() || p.has_root_directory()) refuse("an absolute path");
  for (const auto& part : p)
    if (part == "..") refuse("a '..' component leaves the run folder");
  std::filesystem::path norm = p.lexically_normal();
  if (norm.empty() || norm == ".") refuse("names the run folder itself, not a file in it");
  return norm;
}

std::string display_name(const std::filesystem::path& p) {
  std::error_code ec;
  const std::filesystem::path cwd = std::filesystem::current_path(ec);
  if (!ec && p.is_absolute()) {
    const std::filesystem::path rel = p.lexically_relative(cwd);
    if (!rel.empty() && *rel.begin() != "..") return rel.generic_string();
  }
  return p.lexically_normal().generic_string();
}


}  // namespace slipscreen::formats
