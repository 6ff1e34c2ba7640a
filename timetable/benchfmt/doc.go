// Package benchfmt reads and writes the public benchmark formats that
// termwright is measured on, and evaluates each format's published cost
// independently of timetable.Cost and of the encoder:
//
//   - the curriculum-based course timetabling track of the Second
//     International Timetabling Competition (ITC-2007, .ctt files): ReadCTT,
//     WriteCTT, CTTCost, CTTHardViolations, ReadCTTSolution,
//     WriteCTTSolution, ReadCTTBest;
//   - the International Timetabling Competition 2019 (ITC-2019, XML files):
//     ReadXML, XMLInstance.Term (the mapping into a term of pattern
//     sections, courses and students' requests), XMLSolutionOf,
//     WriteXMLSolution, ReadXMLSolution (solutions with every class's
//     students), XMLCost, XMLHardViolations (the student rules included),
//     ReadXMLBest.
//
// Benchmark data is read from where it lies (the shared data folder) and
// never copied into the repository; the competitions' element names stay
// inside this package and never reach the workbook, commands or messages.
package benchfmt
