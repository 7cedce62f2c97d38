/* LP reference for the lower hull, solved by glpsol (Debian package glpk-utils).
   All queries in one problem with independent blocks: for each query q,
     minimise sum_j lam[q,j] E[j]  subject to  sum_j lam[q,j] x[j,k] = xq[q,k] for every component k, lam >= 0,
   with x[j,k] the composition fractions of point j. The blocks share no variable or row, so an optimum of the
   summed objective is an optimum of every block. Answers go to answers.txt in the working folder:
     H <query> <hull energy>            one line per query
     W <query> <point> <lambda>         one line per positive lambda */
set P;
set K;
set Q;
param amount{P, K} >= 0;
param E{P};
param xq{Q, K};
param x{j in P, k in K} := amount[j, k] / sum{kk in K} amount[j, kk];

var lam{Q, P} >= 0;

minimize total: sum{q in Q, j in P} E[j] * lam[q, j];

s.t. balance{q in Q, k in K}: sum{j in P} x[j, k] * lam[q, j] = xq[q, k];

solve;

printf{q in Q} "H %d %.17g\n", q, sum{j in P} E[j] * lam[q, j] > "answers.txt";
printf{q in Q, j in P: lam[q, j] > 1e-12} "W %d %d %.17g\n", q, j, lam[q, j] >> "answers.txt";

end;
