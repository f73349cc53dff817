// Writing the report files: stage every file under a temporary name, then rename them all, so an
// interrupted or failed run leaves no partial report (rename(2) replaces a file atomically).
#include <unistd.h>

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <set>

#include "core/error.hpp"
#include "report/staging.hpp"
#include "report/svg.hpp"
#include "report/writers.hpp"

namespace standoff::report {

namespace fs = std::filesystem;

std::vector<std::pair<std::string, std::string>> report_files(const Record& r) {
  std::vector<std::pair<std::string, std::string>> files;
  files.emplace_back("report.html", to_html(r));
  files.emplace_back("report.md", to_markdown(r));
  files.emplace_back("report.json", to_json(r).dump(2) + "\n");
  files.emplace_back("site-map.svg", site_map_svg(r, true));
  if (r.placement) files.emplace_back("place-heatmap.svg", r.placement->heatmap_svg);
  std::set<std::string> seen;
  for (const auto& op : r.evaluation.operations) {
    if (op.ratio_vs_distance.empty()) continue;
    const std::string name = chart_file_name(op.name);
    if (!seen.insert(name).second) continue;  // two names with one slug: the first one's chart is kept
    files.emplace_back(name, ratio_chart_svg(op, true, chart_marks(r, op)));
  }
  return files;
}

namespace {

Where where_of(const fs::path& p) { return Where{p.string(), 0, "--out"}; }

// Writes all of `content` to `path` and flushes it to the disk; throws InputError on any failure.
void write_whole_file(const fs::path& path, const std::string& content) {
  std::FILE* f = std::fopen(path.c_str(), "wb");
  if (f == nullptr) throw InputError(where_of(path), std::string("cannot create file: ") + std::strerror(errno));
  const bool ok = std::fwrite(content.data(), 1, content.size(), f) == content.size() && std::fflush(f) == 0 &&
                  ::fsync(::fileno(f)) == 0;
  const int saved = errno;
  const bool closed = std::fclose(f) == 0;
  if (!ok || !closed) {
    std::error_code ec;
    fs::remove(path, ec);
    throw InputError(where_of(path), std::string("cannot write file: ") + std::strerror(saved));
  }
}

}  // namespace

std::vector<fs::path> write_files_atomically(const fs::path& dir,
                                             const std::vector<std::pair<std::string, std::string>>& files) {
  for (const auto& [name, content] : files) {
    if (name.empty() || name.find('/') != std::string::npos || name.front() == '.') {
      throw InputError(where_of(dir / name), "report file names must be plain names");
    }
  }
  std::error_code ec;
  fs::create_directories(dir, ec);
  if (ec || !fs::is_directory(dir)) {
    throw InputError(where_of(dir), "cannot create the report directory: " + (ec ? ec.message() : "not a directory"));
  }

  std::vector<fs::path> staged;
  auto discard = [&] {
    for (const auto& p : staged) {
      std::error_code ignore;
      fs::remove(p, ignore);
      unregister_staged(p.string());
    }
  };
  try {
    for (const auto& [name, content] : files) {
      const fs::path tmp = dir / (".tmp-" + name);
      register_staged(tmp.string());  // before the file exists: a signal now removes it
      staged.push_back(tmp);
      write_whole_file(tmp, content);
    }
    hold_if_testing();
    // Nothing final is touched unless every final name can take a regular file.
    for (const auto& [name, content] : files) {
      const fs::path final_path = dir / name;
      if (fs::exists(final_path) && !fs::is_regular_file(final_path)) {
        throw InputError(where_of(final_path), "exists and is not a regular file");
      }
    }
  } catch (...) {
    discard();
    throw;
  }

  std::vector<fs::path> written;
  for (std::size_t k = 0; k < files.size(); ++k) {
    const fs::path final_path = dir / files[k].first;
    fs::rename(staged[k], final_path, ec);
    if (!ec) unregister_staged(staged[k].string());
    if (ec) {
      // Checked above, so this is unexpected (e.g. the disk went away): remove what is left staged.
      for (std::size_t m = k; m < staged.size(); ++m) {
        std::error_code ignore;
        fs::remove(staged[m], ignore);
        unregister_staged(staged[m].string());
      }
      throw InputError(where_of(final_path), "cannot rename the staged file: " + ec.message());
    }
    written.push_back(final_path);
  }
  return written;
}

std::vector<fs::path> write_report(const Record& r, const fs::path& dir) {
  const auto files = report_files(r);
  auto written = write_files_atomically(dir, files);
  // Charts of operations that are no longer in the station would mislead: remove them.
  std::set<std::string> keep;
  for (const auto& f : files) keep.insert(f.first);
  std::error_code ec;
  for (const auto& entry : fs::directory_iterator(dir, ec)) {
    const std::string name = entry.path().filename().string();
    if (name.rfind("chart-", 0) == 0 && entry.path().extension() == ".svg" && !keep.count(name)) {
      std::error_code ignore;
      fs::remove(entry.path(), ignore);
    }
  }
  return written;
}

}  // namespace standoff::report
