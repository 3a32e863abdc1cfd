#include "formats/catalog/catalog_quakeml.hpp"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <cstring>
#include <fstream>
#include <optional>
#include <pugixml.hpp>
#include <sstream>

#include "core/errors.hpp"
#include "formats/files/input_file.hpp"
#include "formats/catalog/catalog_records.hpp"
#include "formats/table/iso_time.hpp"

namespace slipscreen::formats {
namespace {

// Local name of an element ("q:quakeml" -> "quakeml").
const char* local_name(const pugi::xml_node& n) {
  const char* name = n.name();
  const char* colon = std::strrchr(name, ':');
  return colon ? colon + 1 : name;
}

pugi::xml_node child(const pugi::xml_node& n, const char* name) {
  for (auto c : n.children())
    if (c.type() == pugi::node_element && std::strcmp(local_name(c), name) == 0) return c;
  return {};
}

std::vector<pugi::xml_node> children(const pugi::xml_node& n, const char* name) {
  std::vector<pugi::xml_node> out;
  for (auto c : n.children())
    if (c.type() == pugi::node_element && std::strcmp(local_name(c), name) == 0) out.push_back(c);
  return out;
}

std::string text_of(const pugi::xml_node& n) {
  std::string s = n.text().as_string();
  const auto b = s.find_first_not_of(" \t\r\n");
  if (b == std::string::npos) return "";
  return s.substr(b, s.find_last_not_of(" \t\r\n") - b + 1);
}

// <x><value>..</value></x> as a number; nullopt when absent or not a finite number.
std::optional<double> quantity(const pugi::xml_node& parent, const char* name) {
  const std::string s = text_of(child(child(parent, name), "value"));
  if (s.empty()) return std::nullopt;
  double v = 0.0;
  const auto [p, ec] = std::from_chars(s.data(), s.data() + s.size(), v);
  if (ec != std::errc() || p != s.data() + s.size() || !std::isfinite(v)) return std::nullopt;
  return v;
}

// Line numbers from byte offsets.
struct LineIndex {
  std::vector<std::ptrdiff_t> starts{0};
  explicit LineIndex(const std::string& buf) {
    for (std::size_t i = 0; i < buf.size(); ++i)
      if (buf[i] == '\n') starts.push_back(static_cast<std::ptrdiff_t>(i + 1));
  }
  std::size_t line(std::ptrdiff_t offset) const {
    return static_cast<std::size_t>(std::upper_bound(starts.begin(), starts.end(), offset) - starts.begin());
  }
};

// The element whose publicID is `ref`, else the first one (with a warning).
pugi::xml_node preferred(const std::vector<pugi::xml_node>& items, const std::string& ref, const char* what,
                         const std::string& event_id, std::size_t line, std::vector<std::string>& warnings,
                         const std::string& path) {
  if (items.empty()) return {};
  if (!ref.empty())
    for (const auto& it : items)
      if (ref == it.attribute("publicID").as_string()) return it;
  const std::string where = path + " line " + std::to_string(line) + ": event '" + event_id + "': ";
  if (ref.empty())
    warnings.push_back(where + "no preferred" + what + "ID; the first " + what + " is used");
  else
    warnings.push_back(where + "preferred" + what + "ID '" + ref + "' matches no " + what + "; the first is used");
  return items.front();
}

std::string read_whole_file(const std::string& path) {
  if (auto problem = input_file_problem(path)) throw IoError("cannot read catalog file '" + path + "': " + *problem);
  std::ifstream in(path, std::ios::binary);
  if (!in) throw IoError("cannot read catalog file '" + path + "'");
  std::stringstream ss;
  ss << in.rdbuf();
  return ss.str();
}

// The eventParameters description followed by the text of its comments.
std::string catalog_description(const pugi::xml_node& params) {
  std::string description = text_of(child(params, "description"));
  for (const auto& c : children(params, "comment")) {
    const std::string t = text_of(child(c, "text"));
    if (!t.empty()) description += (description.empty() ? "" : " ") + t;
  }
  return description;
}

// One event's preferred origin and magnitude as `e`; otherwise the reason the event is unusable.
// Warnings about the choice of origin or magnitude go to `warnings`.
std::optional<std::string> read_event(const pugi::xml_node& ev, const std::string& id, const std::string& path,
                                      std::size_t line, seismo::Event& e, std::vector<std::string>& warnings) {
  const std::string type = text_of(child(ev, "type"));
  if (type == "not existing") return "event type 'not existing'";
  const auto origin = preferred(children(ev, "origin"), text_of(child(ev, "preferredOriginID")), "Origin", id,
                                line, warnings, path);
  if (!origin) return "no origin";
  const auto magnitude = preferred(children(ev, "magnitude"), text_of(child(ev, "preferredMagnitudeID")),
                                   "Magnitude", id, line, warnings, path);
  if (!magnitude) return "missing magnitude: no magnitude element";
  e.id = id;
  e.source = path + " line " + std::to_string(line);
  const std::string time_text = text_of(child(child(origin, "time"), "value"));
  try {
    e.time = parse_iso8601_utc(time_text, "origin time");
  } catch (const InputError& err) {
    return std::string(err.what());
  }
  const auto lat = quantity(origin, "latitude");
  const auto lon = quantity(origin, "longitude");
  if (!lat || !lon || *lat < -90.0 || *lat > 90.0 || *lon < -180.0 || *lon > 360.0)
    return "origin latitude/longitude missing or out of range";
  e.y = *lat;
  e.x = *lon;
  e.depth = quantity(origin, "depth");  // metres in QuakeML 1.2
  const auto mag = quantity(magnitude, "mag");
  if (!mag || *mag < -5.0 || *mag > 10.5)
    return "missing magnitude: mag/value absent or not a magnitude between -5 and 10.5";
  e.magnitude = *mag;
  e.magnitude_type = text_of(child(magnitude, "type"));
  return std::nullopt;
}

}  // namespace

CatalogReadResult read_catalog_quakeml(const std::string& path) {
  const std::string buf = read_whole_file(path);
  const LineIndex lines(buf);
  pugi::xml_document doc;
  const auto ok = doc.load_buffer(buf.data(), buf.size());
  if (!ok)
    throw InputError("QuakeML", ok.description(), "well-formed XML")
        .located(path + " line " + std::to_string(lines.line(ok.offset)));

  CatalogReadResult r;
  r.path = path;
  r.format = "quakeml";
  r.catalog.kind = seismo::CoordinateKind::geographic;
  r.catalog.crs = "EPSG:4326";
  const auto root = doc.document_element();
  if (std::strcmp(local_name(root), "quakeml") != 0)
    throw InputError("root element", root.name(), "'quakeml' (QuakeML 1.2)").located(path);
  const auto params = child(root, "eventParameters");
  if (!params) throw InputError("eventParameters", "missing", "one eventParameters element").located(path);
  r.catalog.description = catalog_description(params);

  for (const auto& ev : children(params, "event")) {
    ++r.records;
    const std::size_t line = lines.line(ev.offset_debug());
    const std::string id = ev.attribute("publicID").as_string();
    std::vector<std::string> warnings;  // kept only if the event is used
    seismo::Event e;
    if (const auto reason = read_event(ev, id, path, line, e, warnings)) {
      r.rejected.push_back({line, "event '" + id + "': " + *reason});
      continue;
    }
    r.catalog.events.push_back(std::move(e));
    r.warnings.insert(r.warnings.end(), warnings.begin(), warnings.end());
  }
  return r;
}

}  // namespace slipscreen::formats
