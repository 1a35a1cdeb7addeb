#pragma once
/// A cache of the tables made most recently (kernel tables per substrate and frequency),
/// shared by the cases of a sweep. Safe to use from several threads.
#include <cstddef>
#include <deque>
#include <memory>
#include <mutex>

namespace lobe {

template <class Table>
class RecentTables {
 public:
  explicit RecentTables(std::size_t kept) : m_kept(kept) {}

  /// A kept table for which `suits(table)` holds, or a new one from `make()`, kept.
  /// Two threads asking at once for the same new table may both make it; either serves.
  template <class Suits, class Make>
  std::shared_ptr<const Table> find_or_make(Suits suits, Make make) {
    {
      const std::lock_guard<std::mutex> lock(m_guard);
      for (const auto& t : m_tables)
        if (suits(*t)) return t;
    }
    std::shared_ptr<const Table> table = make();
    const std::lock_guard<std::mutex> lock(m_guard);
    m_tables.push_back(table);
    if (m_tables.size() > m_kept) m_tables.pop_front();
    return table;
  }

 private:
  std::size_t m_kept;
  std::mutex m_guard;
  std::deque<std::shared_ptr<const Table>> m_tables;
};

}  // namespace lobe
