#pragma once
// Transient engine: MNA assembly, Newton–Raphson per time point, trapezoidal integration with
// backward-Euler starts, event location for switching devices, and the state-transition
// sensitivity that the shooting method needs.
#include <optional>
#include <string>
#include <vector>

#include <Eigen/Dense>

#include "analysis/solver/circuit.hpp"
#include "analysis/solver/linear_system.hpp"
#include "analysis/solver/solver.hpp"

namespace mainscheck::analysis::solver::detail {

/// Integration formula of one step.
enum class Method { backward_euler, trapezoidal };

/// Integrates a compiled circuit in time.
class Engine {
 public:
  Engine(Circuit& circuit, const SolverOptions& options);

  /// Number of storage states: capacitor voltages, then inductor currents.
  int storage_size() const { return static_cast<int>(c_.capacitors.size() + c_.inductors.size()); }
  /// Current storage state.
  Eigen::VectorXd storage_state() const;
  /// Sets the storage state (and a history consistent with a backward-Euler restart).
  void set_storage_state(const Eigen::VectorXd& s);
  /// Resets every switching device to off.
  void reset_switches();

  /// Integrates from t0 to t1 in n_steps base steps (plus breakpoints and events). When monodromy is
  /// given it receives ∂s(t1)/∂s(t0); when rec is given each accepted time point is appended.
  std::optional<std::string> run(double t0_s, double t1_s, int n_steps, Eigen::MatrixXd* monodromy, Waveforms* rec);

  long steps_taken() const { return steps_; }
  const Eigen::VectorXd& solution() const { return x_; }

 private:
  struct Saved {
    Eigen::VectorXd x, hist;
    std::vector<double> v_last;
    double t;
  };
  void build_pattern();
  void stamp_linear(double h, Method m);
  void step_rhs(double t, double h, Method m);
  void stamp_nonlinear(const Eigen::VectorXd& x_iter, bool& limited);
  double snap_step(double h) const;
  void history_rhs(double h, Method m, const double* hist, Eigen::VectorXd& rhs) const;
  void update_history(double h, Method m, const Eigen::VectorXd& x, const double* hist_old, double* hist_new) const;
  bool newton(double t, double h, Method m, bool predict);
  bool iterate_converged(const Eigen::VectorXd& x_old, const Eigen::VectorXd& x_new) const;
  std::optional<std::string> step_to(double t_end, Method m, Eigen::MatrixXd* sens, Waveforms* rec);
  void accept(double t_new, double h, Method m, Eigen::MatrixXd* sens, Waveforms* rec);
  double earliest_event(const Eigen::VectorXd& x0, const Eigen::VectorXd& x1, int& which) const;
  void toggle_events(const Eigen::VectorXd& x);
  void fire_scheduled(double t);
  void record(Waveforms& rec) const;
  void save(Saved& out) const;
  void restore(const Saved& s);
  double v(const Eigen::VectorXd& x, Index a, Index b) const {
    return (a >= 0 ? x[a] : 0.0) - (b >= 0 ? x[b] : 0.0);
  }

  Circuit& c_;
  const SolverOptions& o_;
  LinearSystem sys_;
  Eigen::VectorXd x_, rhs_, rhs_step_, x_new_, xi_, hist_, hist_tmp_, col_;
  Eigen::MatrixXd sens_next_;
  Saved start_, full_;
  // Last two accepted points of a smooth stretch, for the Newton predictor.
  Eigen::VectorXd x_prev_;
  double t_prev_ = 0;
  bool last_trapezoidal_ = false;
  // The matrix snapshot holds the stamps that are fixed for a step size and formula.
  double linear_h_ = -1;
  Method linear_m_ = Method::backward_euler;
  double t_ = 0;
  bool force_be_ = true;
  long steps_ = 0;
  std::vector<double> event_f0_;
};

}  // namespace mainscheck::analysis::solver::detail
