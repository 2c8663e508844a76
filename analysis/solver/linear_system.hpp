#pragma once
// The MNA matrix with a fixed sparsity pattern: stamps go to precomputed slots, the pattern is
// analysed once (Eigen SparseLU) or a dense LU is used for small systems.
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
    values_[slot_[static_cast<std::size_t>(r) * n_ + c]] += v;
  }
  /// Factorises the current values; false when the matrix is singular.
  bool factorize();
  /// Solves A·x = b with the last factorisation.
  void solve(const Eigen::VectorXd& b, Eigen::VectorXd& x);
  /// Solves A·X = B with the last factorisation.
  void solve(const Eigen::MatrixXd& b, Eigen::MatrixXd& x);
  int size() const { return n_; }
  bool dense() const { return dense_; }

 private:
  int n_ = 0;
  bool dense_ = true;
  bool collecting_ = false;
  std::vector<std::pair<int, int>> pattern_;
  std::vector<int> slot_;
  double* values_ = nullptr;
  Eigen::MatrixXd a_dense_;
  Eigen::PartialPivLU<Eigen::MatrixXd> lu_dense_;
  Eigen::SparseMatrix<double> a_sparse_;
  std::unique_ptr<Eigen::SparseLU<Eigen::SparseMatrix<double>, Eigen::COLAMDOrdering<int>>> lu_sparse_;
};

}  // namespace mainscheck::analysis::solver::detail
