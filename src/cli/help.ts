/** Help texts of the `septum` command and its sub-commands. */

export const MAIN_HELP = `septum — sparse direct solver for symmetric positive definite and quasi-definite systems

Usage: septum <command> [options]

Commands:
  solve A.mtx       order, analyze, factor and solve A x = b; print a summary
  analyze A.mtx     ordering and symbolic statistics only (no numeric work)
  report A.mtx      write a self-contained HTML page showing the block structure
  generate KIND N   write a model problem (grids, elasticity, meshes, graphs,
                    a saddle point)
  demo              cooling-plate heat conduction demo (illustrative scenario)

Options:
  -h, --help        help for septum or for one command (septum solve --help,
                    or septum help solve)
  -v, --version     print the version
  -q, --quiet       no progress line
  --debug           show stack traces on errors

Matrices are read from Matrix Market files (coordinate, real/integer/pattern,
general or symmetric); indices in messages are 1-based, as in the file.
`;

const SEED_TEXT = `  --seed N          seed of the randomized parts of nested dissection (default 1)
  --threads N       threads for nested dissection (default: up to 4, no more than
                    the cores, from 100 000 vertices on); same ordering for any N`;

const ORDERING_TEXT = `  --ordering NAME   auto (default: the fewer flops of nested dissection and
                    minimum degree), nested-dissection (nd), minimum-degree (md),
                    reverse-cuthill-mckee (rcm) or natural
${SEED_TEXT}`;


export const HELP: Record<string, string> = {
  solve: `Usage: septum solve A.mtx [--rhs b.mtx] [-o x.mtx] [options]

Reads the symmetric matrix A, orders it, analyzes, factors and solves A x = b.
Without --rhs, b = A·1, so the exact solution is all ones and the max error is
reported too. A warning naming the column goes to stderr when the smallest
pivot is below 1e-10 of its diagonal entry: A is singular to working
precision (an ungrounded Laplacian, a missing constraint), and x may be
meaningless even when the backward error is small.

Options:
  --rhs FILE        right-hand side(s): an n×k 'array' or 'coordinate' file
  -o, --output FILE write the solution as a Matrix Market 'array' file
${ORDERING_TEXT}
  --method M        cholesky (default; SPD) or ldlt (L·D·Lᵀ, also quasi-definite)
  --kernels K       auto (default), wasm or js dense kernels
  --json            print one JSON object instead of the summary
  -q, --quiet       no progress line
`,
  analyze: `Usage: septum analyze A.mtx [options]

Ordering and symbolic analysis only: n, nnz(A), nnz(L), flops, supernodes,
factor size, predicted peak memory and timings. No numeric work.

Options:
${ORDERING_TEXT}
  --method M        the factorization whose peak memory is predicted: cholesky
                    (default) or ldlt (which needs a scratch block as well)
  --compare         run every ordering and print one table
  --json            print JSON (an array of objects with --compare)
  -q, --quiet       no progress line
`,
  report: `Usage: septum report A.mtx -o report.html [options]

Writes one self-contained HTML page: the pattern of A, of P·A·Pᵀ with the
separator blocks outlined, the pattern of L, the separator tree, and every
ordering's statistics side by side. Large matrices are drawn binned.

Options:
  -o, --output FILE the HTML file to write (required)
${ORDERING_TEXT}
                    (the ordering drawn in detail, default nested-dissection;
                    all are compared)
  -q, --quiet       no progress line
`,
  generate: `Usage: septum generate KIND N [options] -o A.mtx

Writes a symmetric model problem as a Matrix Market file: positive definite,
except saddle2d, which is quasi-definite.

Kinds:
  grid2d K          Laplacian on a K×K grid, 5-point (or --stencil 9: bilinear elements)
  grid3d K          7-point Laplacian on a K×K×K grid
  elasticity3d K    3-D linear elasticity, K×K×K trilinear bricks, 3 unknowns per node
  mesh2d K          P1 Laplacian on an unstructured triangle mesh of a plate with
                    holes, K elements across (K ≥ 60); --contrast C for a
                    conductivity jump of C in inclusions
  laplacian N       screened Laplacian of a random geometric graph with N vertices
                    (--degree D mean degree, default 8; --seed S)
  saddle2d K        quasi-definite saddle point (stabilized Stokes shape): two
                    velocity components on a K×K grid plus pressures; solve it
                    with --method ldlt

Options:
  -o, --output FILE the Matrix Market file to write (required)
  -q, --quiet       no 'wrote' line
`,
  demo: `Usage: septum demo [-o DIR] [--size H]

Steady heat conduction in a thin aluminium cooling plate under a battery module
(an illustrative scenario with invented data): meshes the plate, assembles P1
finite elements, solves with every ordering, checks the discretization on a
manufactured solution, and writes report.html and temperature.svg to DIR
(default ./septum-demo).

Options:
  -o, --output DIR  where to write the pictures (default septum-demo)
  --size H          mesh spacing in millimetres (default 1.5)
  -q, --quiet       no progress line
`,
};
