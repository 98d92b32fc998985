//! Help text for the keys of every family, written once and shown by every
//! subcommand's `--help`.

/// The families, their keys and the names of their parameters.
pub const FAMILIES: &str = "\
FAMILIES AND KEYS (--prior, --data, --future; parameter names in the output)

  beta-binomial            success probability theta ~ Beta(alpha, beta)
      --prior alpha=A,beta=B          or mean=M,ess=N (N pseudo-trials)
      --data  successes=S,trials=N
      --future trials=M               successes in M future trials
      parameters: theta

  gamma-poisson            event rate lambda per unit exposure ~ Gamma(shape alpha, rate beta)
      --prior alpha=A,beta=B          or mean=RATE,ess=EXPOSURE
      --data  events=Y,exposure=T
      --future exposure=T             events in a future exposure T
      parameters: lambda

  gamma-exponential        failure rate lambda ~ Gamma(alpha, beta); mean time 1/lambda
      --prior alpha=A,beta=B          or mean=MEAN_TIME,ess=FAILURES
      --data  failures=D,time=T       T = total time on test, censored units included
      --future n=1                    the next waiting time (Lomax)
      --future time=T                 failures in a future time T (negative binomial)
      parameters: lambda, mean_time

  normal-known-variance    mean mu ~ N(mu0, sigma^2/kappa0), sigma known
      --prior mu0=M,kappa0=K,sigma=S  or mean=M,ess=K,sigma=S
      --data  n=N,mean=YBAR           optional variance=S2 (for the marginal likelihood)
      --future n=M                    the mean of M future values (M=1: one value)
      parameters: mu

  normal-inverse-gamma     sigma2 ~ InvGamma(alpha0, beta0), mu | sigma2 ~ N(mu0, sigma2/kappa0)
      --prior mu0=M,kappa0=K,alpha0=A,beta0=B
                                      or mean=M,ess=K,variance=V,variance_ess=N
      --data  n=N,mean=YBAR,variance=S2   (sample variance, n-1 divisor)
      --future n=M                    the mean of M future values
      parameters: mu (Student-t marginal), sigma2, sigma

  dirichlet-multinomial    shares theta1..thetaK ~ Dirichlet(alpha1..alphaK)
      --prior alpha=A1;A2;...         or mean=S1;S2;...,ess=N; optional names=N1;N2;...
      --data  counts=C1;C2;...
      --future n=M                    each category's count among M draws
      parameters: theta1 ... thetaK (or the category names)

  inverse-gamma-variance   variance sigma2 ~ InvGamma(alpha, beta), mean mu known
      --prior alpha=A,beta=B[,mu=MU]  or mean=VARIANCE_GUESS,ess=N[,mu=MU]
      --data  n=N,ss=SUM_OF_SQUARES_ABOUT_MU
      --future n=1                    one future value (needs mu in --prior)
      parameters: sigma2, sigma

Gamma distributions use shape and RATE; inverse gamma uses shape and SCALE;
Student-t scales are standard-deviation-like. Options take --opt value or
--opt=value; write negative numbers with '=' (--cdf=-100).

CAUTION: a prior can decide a clinical, safety or financial decision. Record
the reasoning behind it, follow the guidance that applies to your field, and
have it reviewed by someone qualified before relying on it.";
