#include "analysis/solver/linear_system.hpp"

#include <algorithm>
#include <cmath>

namespace mainscheck::analysis::solver::detail {

namespace {

constexpr double kPivotThreshold = 0.1;

// Minimum-degree order of the symmetric pattern (A + Aᵀ) (Tinney & Walker, "Direct solutions of
// sparse network equations by optimally ordered triangular factorization", Proc. IEEE 55(11), 1967,
// scheme 2): eliminate the unknown with the fewest neighbours first, joining its neighbours.
std::vector<int> minimum_degree_order(int n, const std::vector<char>& structure) {
  std::vector<std::vector<char>> adj(n, std::vector<char>(n, 0));
  for (int r = 0; r < n; ++r)
    for (int c = 0; c < n; ++c)
      if (r != c && structure[static_cast<std::size_t>(r) * n + c]) adj[r][c] = adj[c][r] = 1;
  std::vector<char> alive(n, 1);
  std::vector<int> order;
  for (int step = 0; step < n; ++step) {
    int best = -1, best_deg = n + 1;
    for (int v = 0; v < n; ++v) {
      if (!alive[v]) continue;
      int deg = 0;
      for (int u = 0; u < n; ++u) deg += alive[u] && adj[v][u];
      if (deg < best_deg) best_deg = deg, best = v;
    }
    alive[best] = 0;
    order.push_back(best);
    for (int a = 0; a < n; ++a)
      if (alive[a] && adj[best][a])
        for (int b = 0; b < n; ++b)
          if (b != a && alive[b] && adj[best][b]) adj[a][b] = 1;
  }
  return order;
}

}  // namespace

void LinearSystem::begin_pattern(int n, bool dense) {
  n_ = n;
  dense_ = dense;
  collecting_ = true;
  pattern_.clear();
  for (int i = 0; i < n; ++i) pattern_.emplace_back(i, i);
}

void LinearSystem::end_pattern() {
  collecting_ = false;
  const auto nn = static_cast<std::size_t>(n_) * n_;
  if (dense_) {
    a_.assign(nn, 0.0);
    lu_.assign(nn, 0.0);
    snapshot_.assign(nn, 0.0);
    work_.assign(n_, 0.0);
    perm_.assign(n_, 0);
    nz_cols_.assign(n_, 0);
    structure_.assign(nn, 0);
    for (auto [r, c] : pattern_) structure_[static_cast<std::size_t>(r) * n_ + c] = 1;
    col_order_ = minimum_degree_order(n_, structure_);
    have_order_ = false;
    return;
  }
  slot_.assign(nn, -1);
  std::vector<Eigen::Triplet<double>> trip;
  trip.reserve(pattern_.size());
  for (auto [r, c] : pattern_) trip.emplace_back(r, c, 1.0);
  a_sparse_.resize(n_, n_);
  a_sparse_.setFromTriplets(trip.begin(), trip.end());
  a_sparse_.makeCompressed();
  for (int c = 0; c < n_; ++c)
    for (int k = a_sparse_.outerIndexPtr()[c]; k < a_sparse_.outerIndexPtr()[c + 1]; ++k)
      slot_[static_cast<std::size_t>(a_sparse_.innerIndexPtr()[k]) * n_ + c] = k;
  values_ = a_sparse_.valuePtr();
  snapshot_.assign(static_cast<std::size_t>(a_sparse_.nonZeros()), 0.0);
  x_sparse_ = Eigen::VectorXd::Zero(n_);
  lu_sparse_ = std::make_unique<Eigen::SparseLU<Eigen::SparseMatrix<double>, Eigen::COLAMDOrdering<int>>>();
  // The symbolic analysis (column ordering, elimination tree) is done once for the whole run.
  lu_sparse_->analyzePattern(a_sparse_);
}

void LinearSystem::zero() {
  if (dense_)
    std::fill(a_.begin(), a_.end(), 0.0);
  else
    std::fill(values_, values_ + a_sparse_.nonZeros(), 0.0);
}

void LinearSystem::take_snapshot() {
  if (dense_)
    std::copy(a_.begin(), a_.end(), snapshot_.begin());
  else
    std::copy(values_, values_ + a_sparse_.nonZeros(), snapshot_.begin());
}

void LinearSystem::restore_snapshot() {
  if (dense_)
    std::copy(snapshot_.begin(), snapshot_.end(), a_.begin());
  else
    std::copy(snapshot_.begin(), snapshot_.end(), values_);
}

bool LinearSystem::factorize() {
  if (!dense_) {
    lu_sparse_->factorize(a_sparse_);
    return lu_sparse_->info() == Eigen::Success;
  }
  if (!have_order_) return factorize_pivoting();
  // Elimination in the pivot order of the last pivoting factorisation, touching only the entries
  // of its elimination lists. A pivot below 1e-3 of the largest entry under it in its column (the
  // relative threshold of SPICE's sparse solver, Kundert, "Sparse matrix techniques", in Ruehli
  // (ed.), Circuit Analysis, Simulation and Design, 1986) sends the matrix back to partial pivoting.
  const int n = n_;
  double* lu = lu_.data();
  // Only the entries of the filled pattern are read below, so only they are loaded.
  for (const auto& [dst, src] : gather_) lu[dst] = src >= 0 ? a_[src] : 0.0;
  for (int k = 0; k < n; ++k) {
    double* rk = lu + static_cast<std::size_t>(k) * n;
    const double piv = rk[k];
    double col_max = 0;
    for (int q = l_start_[k]; q < l_start_[k + 1]; ++q)
      col_max = std::max(col_max, std::abs(lu[static_cast<std::size_t>(l_rows_[q]) * n + k]));
    if (!(std::abs(piv) > 1e-300) || std::abs(piv) < kPivotThreshold * col_max) return factorize_pivoting();
    const double inv = 1.0 / piv;
    rk[k] = inv;
    for (int q = l_start_[k]; q < l_start_[k + 1]; ++q) {
      double* ri = lu + static_cast<std::size_t>(l_rows_[q]) * n;
      if (ri[k] == 0.0) continue;
      const double f = ri[k] * inv;
      ri[k] = f;
      for (int u = u_start_[k]; u < u_start_[k + 1]; ++u) ri[u_cols_[u]] -= f * rk[u_cols_[u]];
    }
  }
  return true;
}

bool LinearSystem::factorize_pivoting() {
  // Gaussian elimination with threshold partial pivoting (Golub & Van Loan, "Matrix Computations",
  // 4th ed., alg. 3.4.1; the threshold as in SPICE's sparse solver), row-major, on the columns in
  // minimum-degree order: the unknown's own row is the pivot while it is at least 0.1 of the
  // column's largest entry, which keeps the fill of the ordering, else the largest entry is. A row
  // whose multiplier is zero is skipped and the update touches only the pivot row's non-zero
  // columns. The row order found is kept for the following factorisations.
  ++repivots_;
  have_order_ = false;
  const int n = n_;
  double* lu = lu_.data();
  for (int i = 0; i < n; ++i) {
    perm_[i] = i;
    const double* src = a_.data() + static_cast<std::size_t>(i) * n;
    for (int k = 0; k < n; ++k) lu[static_cast<std::size_t>(i) * n + k] = src[col_order_[k]];
  }
  for (int k = 0; k < n; ++k) {
    int p = k, own = -1;
    double best = -1;
    for (int i = k; i < n; ++i) {
      const double v = std::abs(lu[static_cast<std::size_t>(i) * n + k]);
      if (v > best) best = v, p = i;
      if (perm_[i] == col_order_[k]) own = i;
    }
    if (!(best > 1e-300)) return false;
    if (own >= 0 && std::abs(lu[static_cast<std::size_t>(own) * n + k]) >= kPivotThreshold * best) p = own;
    double* rk = lu + static_cast<std::size_t>(k) * n;
    if (p != k) {
      std::swap_ranges(rk, rk + n, lu + static_cast<std::size_t>(p) * n);
      std::swap(perm_[k], perm_[p]);
    }
    const double inv = 1.0 / rk[k];
    rk[k] = inv;
    int nnz = 0;
    for (int j = k + 1; j < n; ++j)
      if (rk[j] != 0.0) nz_cols_[nnz++] = j;
    for (int i = k + 1; i < n; ++i) {
      double* ri = lu + static_cast<std::size_t>(i) * n;
      if (ri[k] == 0.0) continue;
      const double f = ri[k] * inv;
      ri[k] = f;
      for (int q = 0; q < nnz; ++q) ri[nz_cols_[q]] -= f * rk[nz_cols_[q]];
    }
  }
  build_elimination_lists();
  return true;
}

void LinearSystem::build_elimination_lists() {
  // Symbolic elimination of the stamp pattern in the row order perm_: fill-in (i, j) appears when
  // (i, k) and (k, j) are both present for a pivot k < i, j. The pattern holds every position any
  // stamp can reach, so the lists cover every non-zero the numeric elimination can produce.
  const int n = n_;
  std::vector<char> s(static_cast<std::size_t>(n) * n);
  for (int i = 0; i < n; ++i)
    for (int k = 0; k < n; ++k)
      s[static_cast<std::size_t>(i) * n + k] = structure_[static_cast<std::size_t>(perm_[i]) * n + col_order_[k]];
  l_start_.assign(1, 0);
  u_start_.assign(1, 0);
  l_rows_.clear();
  u_cols_.clear();
  for (int k = 0; k < n; ++k) {
    const char* rk = s.data() + static_cast<std::size_t>(k) * n;
    for (int j = k + 1; j < n; ++j)
      if (rk[j]) u_cols_.push_back(j);
    for (int i = k + 1; i < n; ++i) {
      char* ri = s.data() + static_cast<std::size_t>(i) * n;
      if (!ri[k]) continue;
      l_rows_.push_back(i);
      for (int j = k + 1; j < n; ++j) ri[j] |= rk[j];
    }
    l_start_.push_back(static_cast<int>(l_rows_.size()));
    u_start_.push_back(static_cast<int>(u_cols_.size()));
  }
  gather_.clear();
  for (int i = 0; i < n; ++i)
    for (int k = 0; k < n; ++k) {
      if (!s[static_cast<std::size_t>(i) * n + k]) continue;
      const std::size_t src = static_cast<std::size_t>(perm_[i]) * n + col_order_[k];
      gather_.emplace_back(i * n + k, structure_[src] ? static_cast<int>(src) : -1);
    }
  have_order_ = true;
}

void LinearSystem::solve_in_place(double* b) {
  if (!dense_) {
    x_sparse_ = lu_sparse_->solve(Eigen::Map<const Eigen::VectorXd>(b, n_));
    std::copy(x_sparse_.data(), x_sparse_.data() + n_, b);
    return;
  }
  // Forward substitution by columns of L, back substitution by rows of U, over the elimination lists.
  const int n = n_;
  const double* lu = lu_.data();
  double* y = work_.data();
  for (int i = 0; i < n; ++i) y[i] = b[perm_[i]];
  for (int k = 0; k < n; ++k) {
    const double yk = y[k];
    if (yk == 0.0) continue;
    for (int q = l_start_[k]; q < l_start_[k + 1]; ++q)
      y[l_rows_[q]] -= lu[static_cast<std::size_t>(l_rows_[q]) * n + k] * yk;
  }
  for (int k = n - 1; k >= 0; --k) {
    const double* rk = lu + static_cast<std::size_t>(k) * n;
    double s = y[k];
    for (int u = u_start_[k]; u < u_start_[k + 1]; ++u) s -= rk[u_cols_[u]] * y[u_cols_[u]];
    y[k] = s * rk[k];
  }
  for (int k = 0; k < n; ++k) b[col_order_[k]] = y[k];
}

void LinearSystem::solve(const Eigen::VectorXd& b, Eigen::VectorXd& x) {
  x = b;
  solve_in_place(x.data());
}

}  // namespace mainscheck::analysis::solver::detail
