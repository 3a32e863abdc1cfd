#pragma once
// What paths a scenario may name (docs/scenario.md: a scenario from someone else can only read the
// inputs it names and only write inside its run folder; no network access).
//
// - Network paths are refused unless explicitly allowed: any GDAL virtual network file system
//   (/vsicurl/, /vsicurl_streaming/, /vsis3/, /vsigs/, /vsiaz/, /vsiadls/, /vsioss/, /vsiswift/,
//   /vsiwebhdfs/, /vsihdfs/, and their _streaming forms), anything with a URL scheme
//   ("http://", "https://", "ftp://", "s3://", "file://", ...), and GDAL connection strings
//   with a driver prefix ("PG:...", "WFS:...", "MSSQL:..." — two or more letters then ':').
//   The check looks at the whole string, so a network path nested in /vsizip/ is caught too.
// - Output paths named by a scenario are relative to the run folder and must stay inside it:
//   absolute paths, a root name, an empty path and any ".." component are refused, and so is a
//   control character (newline, tab, NUL, ... : U+0000-U+001F and U+007F), which would make a file
//   name that breaks listings, tables and the manifest.
#include <filesystem>
#include <string>
#include <string_view>

namespace slipscreen::formats {

// True when GDAL would treat `path` as a network resource or a database connection.
bool is_network_path(std::string_view path);

// Throws RefusedError naming `field` and the path when is_network_path(path) and
// !allow_network. `field` is the scenario key or option that named the path.
void require_local_path(std::string_view path, bool allow_network, std::string_view field);

// Checks an output path named by scenario key `key` and returns it normalised (relative).
// Throws RefusedError naming the key and value (shown with escaped_text) for an absolute path,
// a ".." component, a network path, a control character or an empty value.
std::filesystem::path safe_relative_output(std::string_view key, std::string_view value);

// True when `text` holds a control character (U+0000-U+001F or U+007F).
bool has_control_character(std::string_view text);

// `text` for a one-line message: control characters written as \n, \t, \0 or \xHH.
std::string escaped_text(std::string_view text);

// True for a path GDAL would not take as a local file: a virtual file system ("/vsimem/",
// "/vsizip/", any "/vsi" prefix, in any letter case) or is_network_path.
bool is_virtual_or_network_path(std::string_view path);

// Display name of a path for messages: relative to the working directory when inside it.
std::string display_name(const std::filesystem::path& p);

}  // namespace slipscreen::formats
