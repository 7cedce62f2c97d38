Console.WriteLine("benchmarks: under construction");
