#pragma once
// The MNA matrix with a fixed sparsity pattern. Small systems use a dense row-major LU with partial
// pivoting that skips the zero entries of the MNA matrix; large ones go to Eigen SparseLU with the
// pattern analysed once. A snapshot of the values lets the caller stamp the parts that stay fixed
// over a time step once and add only the nonlinear stamps per Newton iteration.
#include <memory>
#include <utility>
#include <vector>

#include <Eigen/Dense>
#include <Eigen/Sparse>
#include <Eigen/SparseLU>

namespace mainscheck::analysis::solver::detail {

/// Square system matrix whose non-zero pattern is fixed after begin_pattern()/end_pattern().
class LinearSystem {
 public:
  /// Starts collecting the pattern of an n×n matrix; add() records positions until end_pattern().
  void begin_pattern(int n, bool dense);
  /// Freezes the pattern and analyses it once.
  void end_pattern();
  /// Sets every stored value to zero.
  void zero();
  /// Adds v at (r, c); negative indices (ground) are ignored.
  void add(int r, int c, double v) {
    if (r < 0 || c < 0) return;
    if (collecting_) {
      pattern_.emplace_back(r, c);
      return;
    }
    if (dense_)
      a_[static_cast<std::size_t>(r) * n_ + c] += v;
    else
      values_[slot_[static_cast<std::size_t>(r) * n_ + c]] += v;
  }
  /// Stores the current values so that restore_snapshot() can return to them.
  void take_snapshot();
  /// Replaces the values by the last snapshot.
  void restore_snapshot();
  /// Factorises the current values; false when the matrix is singular.
  bool factorize();
  /// Solves A·x = b with the last factorisation.
  void solve(const Eigen::VectorXd& b, Eigen::VectorXd& x);
  /// Solves A·x = b in place (b has size() entries) with the last factorisation.
  void solve_in_place(double* b);
  int size() const { return n_; }
  /// Number of factorisations that chose a new pivot order (the first one included).
  long repivots() const { return repivots_; }
  bool dense() const { return dense_; }

 private:
  int n_ = 0;
  bool dense_ = true;
  bool collecting_ = false;
  std::vector<std::pair<int, int>> pattern_;
  bool factorize_pivoting();
  void build_elimination_lists();
  // Dense path: row-major values, LU factors (unit L below, U with inverted diagonal), row order,
  // the column order (minimum degree of the stamp pattern), and the elimination lists of that order: for pivot k, the rows below with a (possible) entry in
  // column k and the columns right of k with a (possible) entry in row k, fill-in included.
  std::vector<double> a_, lu_, snapshot_, work_;
  std::vector<int> perm_, col_order_, nz_cols_;
  std::vector<int> l_start_, l_rows_, u_start_, u_cols_;
  std::vector<std::pair<int, int>> gather_;  // (factor position, value position or -1 for fill-in)
  std::vector<char> structure_;
  bool have_order_ = false;
  long repivots_ = 0;
  // Sparse path.
  std::vector<int> slot_;
  double* values_ = nullptr;
  Eigen::SparseMatrix<double> a_sparse_;
  Eigen::VectorXd x_sparse_;
  std::unique_ptr<Eigen::SparseLU<Eigen::SparseMatrix<double>, Eigen::COLAMDOrdering<int>>> lu_sparse_;
};

}  // namespace mainscheck::analysis::solver::detail
