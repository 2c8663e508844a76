#include "parser/expression.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <map>
#include <string>

namespace mainscheck::parser {
namespace {

ExprResult eval(std::string_view text, std::size_t max_depth = 256) {
  const std::map<std::string, double, std::less<>> params{{"rload", 220.0}, {"vpk", 325.0}, {"f", 50.0}};
  return evaluate_expression(
      text,
      [&](std::string_view n) -> NameValue {
        const auto it = params.find(n);
        if (it == params.end()) return {};
        return {it->second, ""};
      },
      max_depth);
}

double value_of(std::string_view text) {
  const ExprResult r = eval(text);
  EXPECT_TRUE(r.value.has_value()) << text << ": " << r.error;
  return r.value.value_or(std::nan(""));
}

void expect_error(std::string_view text, std::size_t offset, const std::string& message) {
  const ExprResult r = eval(text);
  EXPECT_FALSE(r.value.has_value()) << text;
  EXPECT_EQ(r.error, message) << text;
  EXPECT_EQ(r.error_offset, offset) << text;
}

struct ExprCase {
  const char* text;
  double value;
};

// reference: ngspice-39 run on 2026-12-01, deck tests/data/expr/expressions.cir (`ngspice -b
// expressions.cir`, `.param rload=220`, `.param p<N>={expr}`, `print @r<N>[resistance]` with
// `set numdgt=15`). ngspice substitutes parameter values as text, so its last digit wobbles
// (1+2*3 prints as 7.000000000000001); compare to 1e-14 relative.
// Observed and matched: -2**2 = -4 (unary minus binds looser than **), 2**3**2 = 64 (left to
// right), (-2)**3 = 8 and pwr(-2,3) = 8 (magnitude of the base), pow(-2,3) = -8, nint(2.5) = 2.
constexpr ExprCase kNgspiceTable[] = {
    {"1+2*3", 7.000000000000001e+00},         {"-2**2+10", 6.000000000000001e+00},
    {"2**3**2", 6.400000000000000e+01},       {"2^3^2", 6.400000000000000e+01},
    {"(-2)**3+10", 1.800000000000000e+01},    {"2**-3**2", 1.562500000000000e-02},
    {"2**-1", 5.000000000000000e-01},         {"-2**2*3+20", 8.000000000000000e+00},
    {"!0+1", 2.000000000000000e+00},          {"!2+1", 1.000000000000000e+00},
    {"2*-3+10", 4.000000000000000e+00},       {"1/3", 3.333333333333333e-01},
    {"7%3", 1.000000000000000e+00},           {"-7%3+10", 9.000000000000000e+00},
    {"3>2", 1.000000000000000e+00},           {"2<=1+1", 1.000000000000000e+00},
    {"1==1", 1.000000000000000e+00},          {"1!=1+1", 1.000000000000000e+00},
    {"1&&0+1", 1.000000000000000e+00},        {"0||2", 1.000000000000000e+00},
    {"1?2:3", 2.000000000000000e+00},         {"0?2:3", 3.000000000000000e+00},
    {"0?1:0?5:6", 6.000000000000001e+00},     {"ternary_fcn(0,2,3)", 3.000000000000000e+00},
    {"sgn(-3)+2", 1.000000000000000e+00},     {"int(-2.7)+5", 3.000000000000000e+00},
    {"floor(-2.5)+5", 2.000000000000000e+00}, {"ceil(2.1)", 3.000000000000000e+00},
    {"log(10)", 2.302585092994046e+00},       {"log10(1000)", 3.000000000000000e+00},
    {"exp(1)", 2.718281828459045e+00},        {"sqrt(2)", 1.414213562373095e+00},
    {"min(3,4)", 3.000000000000000e+00},      {"max(3,4)", 4.000000000000000e+00},
    {"pow(2,10)", 1.024000000000000e+03},     {"pow(-2,3)+10", 2.000000000000000e+00},
    {"pwr(-2,3)", 8.000000000000000e+00},     {"pwr(-3,1)", 3.000000000000000e+00},
    {"nint(2.5)", 2.000000000000000e+00},     {"nint(3.5)", 4.000000000000000e+00},
    {"nint(-2.5)+5", 3.000000000000000e+00},  {"abs(-5)", 5.000000000000000e+00},
    {"sin(1)", 8.414709848078965e-01},        {"cos(1)", 5.403023058681398e-01},
    {"tan(1)", 1.557407724654902e+00},        {"asin(0.5)", 5.235987755982989e-01},
    {"acos(0.5)", 1.047197551196598e+00},     {"atan(1)*4", 3.141592653589793e+00},
    {"sinh(1)", 1.175201193643801e+00},       {"cosh(1)", 1.543080634815244e+00},
    {"tanh(0.5)", 4.621171572600097e-01},     {"470k/2", 2.350000000000000e+05},
    {"2k*3", 6.000000000000000e+03},          {"1e3k", 1.000000000000000e+06},
    {"10uF*1e6", 1.000000000000000e+01},      {"2.2meg/1k", 2.200000000000000e+03},
    {"rload*2", 4.400000000000000e+02},       {"RLoad/4+1", 5.600000000000000e+01},
    {"0?1/0:3", 3.000000000000000e+00},       {"1||1/0", 1.000000000000000e+00},
    {"(-8)**(1/3)+5", 7.000000000000001e+00},
};

TEST(Expression, MatchesNgspiceTable) {
  for (const auto& c : kNgspiceTable) {
    SCOPED_TRACE(c.text);
    const ExprResult r = eval(c.text);
    ASSERT_TRUE(r.value.has_value()) << r.error;
    EXPECT_NEAR(*r.value, c.value, std::max(std::abs(c.value) * 1e-14, 1e-15));
  }
}

TEST(Expression, Precedence) {
  EXPECT_EQ(value_of("1+2*3"), 7.0);
  EXPECT_EQ(value_of("(1+2)*3"), 9.0);
  EXPECT_EQ(value_of("10-4-3"), 3.0);
  EXPECT_EQ(value_of("64/4/2"), 8.0);
  EXPECT_EQ(value_of("-2**2"), -4.0);
  EXPECT_EQ(value_of("-2^2"), -4.0);
  EXPECT_EQ(value_of("2**-1"), 0.5);
  EXPECT_EQ(value_of("1+2 > 2"), 1.0);
  EXPECT_EQ(value_of("1 < 2 && 3 < 2"), 0.0);
  EXPECT_EQ(value_of("1 < 2 || 3 < 2"), 1.0);
  EXPECT_EQ(value_of("0 && 1 || 1"), 1.0);
  EXPECT_EQ(value_of("1 ? 2 : 3 + 4"), 2.0);
  EXPECT_EQ(value_of("0 ? 2 : 3 + 4"), 7.0);
  EXPECT_EQ(value_of("1 ? 0 ? 5 : 6 : 7"), 6.0);
  EXPECT_EQ(value_of("--3"), 3.0);
  EXPECT_EQ(value_of("-+-3"), 3.0);
  EXPECT_EQ(value_of("!!5"), 1.0);
  EXPECT_EQ(value_of("!0 == 1"), 1.0);
  EXPECT_EQ(value_of("2 >= 2"), 1.0);
  EXPECT_EQ(value_of("2 <= 1"), 0.0);
  EXPECT_EQ(value_of("5 % 3"), 2.0);
}

TEST(Expression, NumbersTakeSpiceSuffixes) {
  EXPECT_EQ(value_of("470k"), 470e3);
  EXPECT_EQ(value_of("2k*3"), 6000.0);
  EXPECT_EQ(value_of("1MEG/1k"), 1000.0);
  EXPECT_EQ(value_of("100M"), 0.1);
  EXPECT_EQ(value_of("10uF"), 1e-5);
  EXPECT_EQ(value_of("1e3k"), 1e6);
  EXPECT_EQ(value_of(".5+5."), 5.5);
  EXPECT_DOUBLE_EQ(value_of("1mil"), 25.4e-6);
}

TEST(Expression, NamesResolveThroughTheCallbackOnly) {
  EXPECT_EQ(value_of("rload/2"), 110.0);
  EXPECT_EQ(value_of("RLOAD*2"), 440.0);  // case-insensitive: the resolver sees lower case
  EXPECT_EQ(value_of("vpk*f"), 325.0 * 50.0);
  // ngspice-39: `{pi}` is "Undefined parameter [pi]"; neither pi nor e is predefined.
  expect_error("pi", 0, "undefined parameter 'pi'");
  expect_error("2*e", 2, "undefined parameter 'e'");
  expect_error("rload + x", 8, "undefined parameter 'x'");
  const ExprResult custom = evaluate_expression("a+b", [](std::string_view n) -> NameValue {
    if (n == "a") return {1.0, ""};
    return {std::nullopt, "parameter 'b' is circular"};
  });
  EXPECT_EQ(custom.error, "parameter 'b' is circular");
  EXPECT_EQ(custom.error_offset, 2u);
  EXPECT_FALSE(evaluate_expression("a", NameResolver{}).value.has_value());
}

TEST(Expression, Functions) {
  EXPECT_EQ(value_of("sqrt(16)"), 4.0);
  EXPECT_DOUBLE_EQ(value_of("exp(1)"), std::exp(1.0));
  EXPECT_DOUBLE_EQ(value_of("log(10)"), std::log(10.0));
  EXPECT_EQ(value_of("log10(1000)"), 3.0);
  EXPECT_EQ(value_of("abs(-5)"), 5.0);
  EXPECT_EQ(value_of("min(3, 4)"), 3.0);
  EXPECT_EQ(value_of("max(3, 4)"), 4.0);
  EXPECT_EQ(value_of("pow(2, 10)"), 1024.0);
  EXPECT_EQ(value_of("pow(-2, 3)"), -8.0);
  EXPECT_EQ(value_of("pwr(-2, 3)"), 8.0);
  EXPECT_EQ(value_of("floor(-2.5)"), -3.0);
  EXPECT_EQ(value_of("ceil(2.1)"), 3.0);
  EXPECT_EQ(value_of("int(-2.7)"), -2.0);
  EXPECT_EQ(value_of("int(2.7)"), 2.0);
  EXPECT_EQ(value_of("sgn(-3)"), -1.0);
  EXPECT_EQ(value_of("sgn(0)"), 0.0);
  EXPECT_EQ(value_of("sgn(7)"), 1.0);
  EXPECT_EQ(value_of("nint(2.5)"), 2.0);
  EXPECT_EQ(value_of("nint(3.5)"), 4.0);
  EXPECT_EQ(value_of("nint(-2.5)"), -2.0);
  EXPECT_EQ(value_of("nint(2.6)"), 3.0);
  EXPECT_EQ(value_of("nint(-2.4)"), -2.0);
  EXPECT_DOUBLE_EQ(value_of("atan(1)*4"), 3.14159265358979323846);
  EXPECT_DOUBLE_EQ(value_of("sin(1)"), std::sin(1.0));
  EXPECT_DOUBLE_EQ(value_of("tanh(0.5)"), std::tanh(0.5));
  EXPECT_EQ(value_of("ternary_fcn(0, 2, 3)"), 3.0);
  EXPECT_EQ(value_of("ternary_fcn(1, 2, 1/0)"), 2.0);  // only the chosen branch is evaluated
  EXPECT_EQ(value_of("MAX(1, 2)"), 2.0);               // function names are case-insensitive
  EXPECT_EQ(value_of("max (1, 2)"), 2.0);
}

TEST(Expression, RandomFunctionsGiveNominalValueWithWarning) {
  // ngspice-39 draws a random value (a one-line deck with agauss(5,1,3) gave 4.76575 on 2026-12-01);
  // we use the nominal value, which is what a worst-case check must start from.
  for (const char* t : {"agauss(5, 1, 3)", "agauss(5, 1)", "gauss(5, 0.1, 3)", "aunif(5, 1)", "unif(5, 0.1)",
                        "limit(5, 1)"}) {
    const ExprResult r = eval(t);
    ASSERT_TRUE(r.value.has_value()) << t;
    EXPECT_EQ(*r.value, 5.0) << t;
    ASSERT_EQ(r.warnings.size(), 1u) << t;
    EXPECT_NE(r.warnings[0].find("nominal value 5"), std::string::npos) << r.warnings[0];
  }
  EXPECT_EQ(eval("agauss(5, 1, 3)").warnings[0],
            "agauss(5, 1, 3) is evaluated at its nominal value 5; random variation is not modelled");
}

TEST(Expression, PowerChainsWarn) {
  const ExprResult r = eval("2**3**2");
  EXPECT_EQ(*r.value, 64.0);
  ASSERT_EQ(r.warnings.size(), 1u);
  EXPECT_EQ(r.warnings[0],
            "'2**3**2' is evaluated left to right as (2**3)**2, like ngspice; add parentheses");
  EXPECT_TRUE(eval("2**3").warnings.empty());
  EXPECT_TRUE(eval("(2**3)**2").warnings.empty());
  const ExprResult neg = eval("(-2)**3");
  EXPECT_EQ(*neg.value, 8.0);
  ASSERT_EQ(neg.warnings.size(), 1u);
  EXPECT_EQ(neg.warnings[0],
            "(-2) ** 3 is evaluated as 2 ** 3 = 8, like ngspice; use pow() for a signed power");
}

TEST(Expression, NumberWarningsAndErrorsInside) {
  const ExprResult a = eval("1a+1");
  EXPECT_EQ(*a.value, 2.0);
  ASSERT_EQ(a.warnings.size(), 1u);
  EXPECT_EQ(a.warnings[0], "'1a' read as 1: 'a' is not a SPICE scale suffix and is ignored");
  // ngspice-39 rejects {2k2} ("Misplaced operator"), checked with a one-line deck.
  expect_error("1+2k2", 2,
               "'2k2' is not a valid number in an expression (ngspice-39 rejects it too); write 2.2k if that "
               "was meant");
  expect_error("1..5", 0, "malformed number '1..5': unexpected second '.'");
  expect_error("2*1e+", 2, "malformed number '1e+': exponent has no digits");
  expect_error("1e+ + 2", 0, "malformed number '1e+': exponent has no digits");
  expect_error("(1.2.3)*2", 1, "malformed number '1.2.3': unexpected second '.'");
  expect_error("1e999", 0, "number '1e999' is too large for a double");
}

TEST(Expression, MathErrors) {
  expect_error("1/0", 1, "division by zero in 1 / 0");
  expect_error("rload / (rload - 220)", 6, "division by zero in 220 / 0");
  expect_error("5 % 0", 2, "division by zero in 5 % 0");
  expect_error("sqrt(-1)", 0, "square root of a negative value in sqrt(-1)");
  expect_error("1 + log(0)", 4, "logarithm of a non-positive value in log(0)");
  expect_error("log10(-2)", 0, "logarithm of a non-positive value in log10(-2)");
  expect_error("asin(2)", 0, "argument outside [-1, 1] in asin(2)");
  expect_error("exp(1000)", 0, "result of exp(1000) is not finite");
  expect_error("1e300*1e300", 5, "result of 1e+300 * 1e+300 is not finite");
  expect_error("0**-1", 1, "zero raised to a negative power in 0 ** -1");
  expect_error("pow(-8, 1/3)", 0, "result of pow(-8, 0.3333333333333333) is not finite");
}

TEST(Expression, SyntaxErrors) {
  expect_error("(1+2", 0, "unbalanced parentheses: '(' is never closed");
  expect_error("max(1, (2)", 3, "unbalanced parentheses: '(' is never closed");
  expect_error("1+2)", 3, "unbalanced parentheses: ')' has no matching '('");
  expect_error("1 2", 2, "unexpected '2' after the expression");
  expect_error("rload k", 6, "unexpected 'k' after the expression");
  expect_error("1 = 2", 2, "unexpected '= 2' after the expression");
  expect_error("2 +", 3, "expected an operand but found end of expression");
  expect_error("1+*2", 2, "expected an operand but found '*2'");
  expect_error("1 ? 2", 5, "expected ':' but found end of expression");
  expect_error("", 0, "empty expression");
  expect_error("   ", 0, "empty expression");
  expect_error("*", 0, "expected an expression at '*'");
  // Deliberate difference: ngspice-39 gives max(7) = 7, min(3,1,2) = 2, sqrt(4,9) = 3, pow(2) = 1
  // (one-line decks, 2026-12-01); a wrong argument count is an error here.
  expect_error("max(1)", 0, "function 'max' takes 2 arguments, 1 given");
  expect_error("min(3, 1, 2)", 0, "function 'min' takes 2 arguments, 3 given");
  expect_error("pow(2)", 0, "function 'pow' takes 2 arguments, 1 given");
  expect_error("agauss(5)", 0, "function 'agauss' takes 2 to 3 arguments, 1 given");
  expect_error("sqrt(1, 2)", 0, "function 'sqrt' takes 1 argument, 2 given");
  expect_error("sqrt()", 0, "function 'sqrt' takes 1 argument, 0 given");
  expect_error("1 + foo(1)", 4, "unknown function 'foo'");
}

TEST(Expression, NestingLimit) {
  const std::string ok = std::string(256, '(') + "1" + std::string(256, ')');
  EXPECT_EQ(*eval(ok).value, 1.0);
  const std::string deep = std::string(257, '(') + "1" + std::string(257, ')');
  const ExprResult r = eval(deep);
  EXPECT_FALSE(r.value.has_value());
  EXPECT_EQ(r.error, "expression nests deeper than the limit of 256 levels");
  EXPECT_EQ(r.error_offset, 256u);
  // 100000 nested parentheses are refused at the first level beyond the limit.
  const std::string hostile = std::string(100000, '(') + "1" + std::string(100000, ')');
  EXPECT_EQ(eval(hostile).error, "expression nests deeper than the limit of 256 levels");
  EXPECT_EQ(eval(std::string(100000, '(')).error, "expression nests deeper than the limit of 256 levels");
  EXPECT_EQ(eval("((1))", 1).error, "expression nests deeper than the limit of 1 levels");
  std::string conditionals;
  for (int i = 0; i < 300; ++i) conditionals += "1 ? ";
  conditionals += "1";
  for (int i = 0; i < 300; ++i) conditionals += " : 0";
  EXPECT_EQ(eval(conditionals).error, "expression nests deeper than the limit of 256 levels");
}

TEST(Expression, LongFlatInputsAreIterative) {
  // Operator chains, prefix operators and else-chains do not recurse, so they need no limit.
  std::string sum = "0";
  for (int i = 0; i < 100000; ++i) sum += "+1";
  EXPECT_EQ(*eval(sum).value, 100000.0);
  EXPECT_EQ(*eval(std::string(100000, '-') + "3").value, 3.0);
  EXPECT_EQ(*eval(std::string(99999, '!') + "0").value, 1.0);
  std::string chain;
  for (int i = 0; i < 100000; ++i) chain += "0 ? 1 : ";
  chain += "7";
  EXPECT_EQ(*eval(chain).value, 7.0);
}

TEST(Expression, DeepNestingWithinARaisedLimitIsEvaluatedWithoutRecursion) {
  // Issue 15 item 15: a 100 000-deep expression under --max-expression-depth 1000000 crashed the
  // recursive evaluator. Compiling and running are iterative, so the limit bounds heap use only.
  constexpr std::size_t kDeep = 100000;
  constexpr std::size_t kLimit = 1000000;
  const std::string parens = std::string(kDeep, '(') + "1" + std::string(kDeep, ')');
  EXPECT_EQ(*eval(parens, kLimit).value, 1.0);
  std::string calls;
  for (std::size_t i = 0; i < kDeep; ++i) calls += i % 2 ? "abs(" : "-(";
  calls += "2" + std::string(kDeep, ')');
  EXPECT_EQ(*eval(calls, kLimit).value, -2.0);  // the outermost layer is -(abs(...))
  std::string thens;                            // 1 ? (1 ? ... : 0) : 0, nested in the then branch
  for (std::size_t i = 0; i < kDeep; ++i) thens += "1 ? ";
  thens += "5";
  for (std::size_t i = 0; i < kDeep; ++i) thens += " : 0";
  EXPECT_EQ(*eval(thens, kLimit).value, 5.0);
  std::string powers;  // 2**(1**(1**...)), every exponent a group of its own
  for (std::size_t i = 0; i < kDeep; ++i) powers += "1**(";
  powers += "3" + std::string(kDeep, ')');
  EXPECT_EQ(*eval("2**" + powers, kLimit).value, 2.0);
  std::string conditional_calls;  // only the taken branch of each ternary_fcn is evaluated
  for (std::size_t i = 0; i < kDeep; ++i) conditional_calls += "ternary_fcn(1, ";
  conditional_calls += "4";
  for (std::size_t i = 0; i < kDeep; ++i) conditional_calls += ", 1/0)";
  EXPECT_EQ(*eval(conditional_calls, kLimit).value, 4.0);
  const ExprResult too_deep = eval(parens, kDeep - 1);
  EXPECT_EQ(too_deep.error, "expression nests deeper than the limit of 99999 levels");
  EXPECT_EQ(too_deep.error_offset, kDeep - 1);
}

TEST(Expression, ShortCircuitAndConditionalFunctionSkipTheUntakenSide) {
  EXPECT_EQ(*eval("1 || 1/0").value, 1.0);
  EXPECT_EQ(*eval("0 && 1/0").value, 0.0);
  EXPECT_EQ(*eval("0 || 5").value, 1.0);
  EXPECT_EQ(*eval("2 && 0.5 || 1/0").value, 1.0);
  EXPECT_EQ(*eval("ternary_fcn(0, 1/0, 3)").value, 3.0);
  EXPECT_EQ(*eval("ternary_fcn(2, 7, 1/0)").value, 7.0);
  EXPECT_EQ(*eval("1 ? 2 ? 3 : 4 : 5").value, 3.0);
  EXPECT_EQ(*eval("0 ? 2 : 0 ? 3 : 4").value, 4.0);
  EXPECT_EQ(*eval("1 ? 0 ? 3 : 4 : 5").value, 4.0);
  expect_error("ternary_fcn(1, 2)", 0, "function 'ternary_fcn' takes 3 arguments, 2 given");
  expect_error("ternary_fcn(1, 2, 3, 1/0)", 0, "function 'ternary_fcn' takes 3 arguments, 4 given");
  expect_error("max(1, )", 5, "expected ')' but found ', )'");
  expect_error("max(-)", 4, "expected ')' but found '-)'");
  expect_error("(1 2)", 3, "expected ')' but found '2)'");
  expect_error("1 ? 2 3 : 4", 6, "expected ':' but found '3 : 4'");
  expect_error("1 ? 2 : 3 : 4", 10, "unexpected ': 4' after the expression");
  expect_error("2 * -", 4, "expected an operand but found '-'");
  expect_error("1 ? : 2", 4, "expected an expression but found ': 2'");
  expect_error("-", 0, "expected an expression at '-'");
}

TEST(ExpressionNames, InOrderOfFirstUseWithoutFunctions) {
  EXPECT_EQ(expression_names("rload/2 + max(Vpk, rload) * f"),
            (std::vector<std::string>{"rload", "vpk", "f"}));
  EXPECT_EQ(expression_names("sqrt(2)*1k"), std::vector<std::string>{});
  EXPECT_EQ(expression_names("a ? b : c"), (std::vector<std::string>{"a", "b", "c"}));
  EXPECT_EQ(expression_names("-x**y"), (std::vector<std::string>{"x", "y"}));
  EXPECT_EQ(expression_names("1 +"), std::vector<std::string>{});
}

}  // namespace
}  // namespace mainscheck::parser
