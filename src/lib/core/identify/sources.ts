/** The published results (or stated practice) each check cites. See REFERENCES.md. */
export const SOURCES = {
	coverage:
		'Squires, Seigal, Bhate & Uhler 2023 (ICML): one intervention per latent factor suffices for a linear latent model; with one missing, distinct models cannot be told apart in general',
	separation: 'Ahuja, Hartford & Bengio 2022 (NeurIPS): sparse perturbations identify factors only up to the blocks their target sets separate',
	rank: "Support-pattern unmixing: left null space of the non-targeting reagents' effects; Ahuja, Hartford & Bengio 2022 (NeurIPS)",
	exact: 'Linear algebra: rank of the effect matrix for the stated values (exact rational arithmetic)',
	unknown: 'Lachapelle et al. 2022 (CLeaR): recovery from sparse, unlabelled effects; assessed here only by simulation with sparsity-seeking unmixing',
	hard: 'Ahuja, Mahajan, Wang & Bengio 2023 (ICML): one hard intervention per factor (polynomial decoders); Buchholz et al. 2023 (NeurIPS): linear latent model under nonlinear mixing; von Kügelgen et al. 2023 (NeurIPS): two distinct hard interventions per factor in the nonparametric case',
	targetedNone: 'Support-pattern unmixing needs reagents with known targets (Ahuja, Hartford & Bengio 2022, NeurIPS)',
	variance:
		'Pham & Cardoso 2001 (IEEE Trans. Signal Processing 49(9)): joint diagonalisation of non-stationary variances; factors with proportional variance profiles stay mixed (condition as summarised here, not checked against the paper)',
	contextsNone: 'Identification from environments needs at least two of them (Pham & Cardoso 2001; Khemakhem et al. 2020)',
	modulation:
		'Khemakhem, Kingma, Monti & Hyvärinen 2020 (AISTATS), Theorem 1: n·k + 1 contexts whose modulation matrix has full rank n·k',
	meansOnly:
		'Khemakhem, Kingma, Monti & Hyvärinen 2020 (AISTATS), Proposition 1: Gaussian factors whose contexts change only the means are identifiable only up to a linear map',
	gaussian: 'Comon 1994 (Signal Processing 36:287–314): linear mixing is identifiable when at most one factor is Gaussian',
	nonlinearObservational:
		'Hyvärinen & Pajunen 1999 (Neural Networks 12:429–439); Locatello et al. 2019 (ICML): nonlinear mixing is not identifiable without auxiliary information',
	replicates: 'Common practice: at least two replicate wells per reagent and context are needed to estimate well-to-well noise',
	controls: 'Common practice: 8–16 negative-control wells on every plate for per-plate normalisation',
	stock: "The plan's stock limits (maxWells per reagent)",
	capacity: 'Plate geometry (ANSI/SLAS 4-2004 formats) and the cost model',
	budget: "The plan's budget and the cost model (plates × plate cost + wells × cost per well + fixed cost)"
} as const;
